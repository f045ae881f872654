import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { AuditEventsPage } from '@shared/schemas/admin';
import { auditSearchParams, type AuditFilters } from '@/features/admin-audit/lib/audit-query';

export async function getAuditEvents(filters: AuditFilters, page: number, pageSize: number): Promise<AuditEventsPage> {
  return api.get<AuditEventsPage>(`/api/audit-events?${auditSearchParams(filters, { page: String(page), pageSize: String(pageSize) })}`);
}

export function useAuditEvents(filters: AuditFilters, page: number, pageSize: number) {
  return useQuery(
    queryOptions({ queryKey: ['audit-events', filters, page, pageSize], queryFn: () => getAuditEvents(filters, page, pageSize), placeholderData: keepPreviousData }),
  );
}

export function auditExportHref(filters: AuditFilters): string {
  const params = auditSearchParams(filters);
  return `/api/audit-events/export${params.size > 0 ? `?${params}` : ''}`;
}
