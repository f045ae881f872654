import { useSearchParams } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { AuditLogTable } from '@/features/admin-audit/components/audit-log-table';
import { auditExportHref } from '@/features/admin-audit/api/get-audit-events';
import { auditFiltersFrom, auditSearchParams } from '@/features/admin-audit/lib/audit-query';

export function AdminAuditRoute() {
  const [searchParams, setSearchParams] = useSearchParams();
  const filters = auditFiltersFrom(searchParams);
  const page = Math.max(1, Number(searchParams.get('page')) || 1);
  return (
    <div className="space-y-6">
      <title>Audit log · Paraxia</title>
      <PageHeader
        kicker="Administration"
        title="Audit log"
        actions={
          <a
            href={auditExportHref(filters)}
            download
            className="inline-flex h-10 items-center rounded-sheet border border-rule-strong bg-sheet px-4 text-body font-medium text-ink hover:bg-shade"
          >
            Export CSV
          </a>
        }
      >
        Who did what, when, and to which record: sign-ins and failed attempts, role changes, approvals, certificates,
        purges. Newest first; the export carries the same filters.
      </PageHeader>
      <RegionErrorBoundary region="Audit log">
        <AuditLogTable
          filters={filters}
          page={page}
          onChange={(next, nextPage) => setSearchParams(auditSearchParams(next, nextPage > 1 ? { page: String(nextPage) } : {}))}
        />
      </RegionErrorBoundary>
    </div>
  );
}
