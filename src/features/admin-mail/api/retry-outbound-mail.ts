import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OutboundMailMessage } from '@shared/schemas/admin';
import { outboundMailQueryKey } from '@/features/admin-mail/api/get-outbound-mail';

export async function retryOutboundMail(mailId: string): Promise<OutboundMailMessage> {
  const body = await api.post<{ message: OutboundMailMessage }>(`/api/outbound-mail/${encodeURIComponent(mailId)}/retry`);
  return body.message;
}

export function useRetryOutboundMail() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: retryOutboundMail, onSettled: () => queryClient.invalidateQueries({ queryKey: outboundMailQueryKey }) });
}
