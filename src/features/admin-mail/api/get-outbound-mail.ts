import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OutboundMailPage, OutboundMailStatus } from '@shared/schemas/admin';

export const outboundMailQueryKey = ['outbound-mail'] as const;

export async function getOutboundMail(status: OutboundMailStatus | '', page: number, pageSize: number): Promise<OutboundMailPage> {
  const params = new URLSearchParams({ page: String(page), pageSize: String(pageSize) });
  if (status) params.set('status', status);
  return api.get<OutboundMailPage>(`/api/outbound-mail?${params}`);
}

export function useOutboundMail(status: OutboundMailStatus | '', page: number, pageSize: number) {
  return useQuery(
    queryOptions({
      queryKey: [...outboundMailQueryKey, 'list', status, page, pageSize],
      queryFn: () => getOutboundMail(status, page, pageSize),
      placeholderData: keepPreviousData,
      refetchInterval: 15_000,
    }),
  );
}
