import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { StoragePage } from '@/features/admin-storage/components/storage-page';

export function AdminStorageRoute() {
  return (
    <div className="space-y-6">
      <title>Storage and retention · Paraxia</title>
      <PageHeader kicker="Administration" title="Storage and retention">
        What the lab keeps in object storage, by client, work order and measurement; the retention rule for raw frames; and files that no record
        points at.
      </PageHeader>
      <RegionErrorBoundary region="Storage">
        <StoragePage />
      </RegionErrorBoundary>
    </div>
  );
}
