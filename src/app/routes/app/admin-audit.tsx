import { PageHeader } from '@/components/ui/page-header';

export function AdminAuditRoute() {
  return (
    <div className="space-y-6">
      <title>Audit log · Paraxia</title>
      <PageHeader kicker="Administration" title="Audit log">
        Being built.
      </PageHeader>
    </div>
  );
}
