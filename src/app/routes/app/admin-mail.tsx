import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { OutboundMailTable } from '@/features/admin-mail/components/outbound-mail-table';

export function AdminMailRoute() {
  return (
    <div className="space-y-6">
      <title>Outbound mail · Paraxia</title>
      <PageHeader kicker="Administration" title="Outbound mail">
        Every message Paraxia sends is written here first and delivered afterwards. A failed delivery is retried after
        30 s, 2 min, 10 min and 1 h; after the fifth failure it waits for you to try again.
      </PageHeader>
      <RegionErrorBoundary region="Outbound mail">
        <OutboundMailTable />
      </RegionErrorBoundary>
    </div>
  );
}
