import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OutboundMailMessage } from '@shared/schemas/admin';
import { outboundMailQueryKey } from '@/features/admin-mail/api/get-outbound-mail';

export async function getOutboundMessage(mailId: string): Promise<OutboundMailMessage> {
  const body = await api.get<{ message: OutboundMailMessage }>(`/api/outbound-mail/${encodeURIComponent(mailId)}`);
  return body.message;
}

export function useOutboundMessage(mailId: string | null) {
  return useQuery(queryOptions({ queryKey: [...outboundMailQueryKey, 'message', mailId], queryFn: () => getOutboundMessage(mailId!), enabled: mailId !== null }));
}
