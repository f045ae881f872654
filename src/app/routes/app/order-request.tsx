import { PageHeader } from '@/components/ui/page-header';

export function OrderRequestRoute() {
  return (
    <div className="space-y-6">
      <title>Request new work · Paraxia</title>
      <PageHeader kicker="Your orders" title="Request new work">
        Being built.
      </PageHeader>
    </div>
  );
}
