import { PageHeader } from '@/components/ui/page-header';

export function AdminMailRoute() {
  return (
    <div className="space-y-6">
      <title>Outbound mail · Paraxia</title>
      <PageHeader kicker="Administration" title="Outbound mail">
        Being built.
      </PageHeader>
    </div>
  );
}
