import { PageHeader } from '@/components/ui/page-header';

export function AdminStorageRoute() {
  return (
    <div className="space-y-6">
      <title>Storage and retention · Paraxia</title>
      <PageHeader kicker="Administration" title="Storage and retention">
        Being built.
      </PageHeader>
    </div>
  );
}
