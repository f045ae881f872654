import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { ClientOrdersPanel } from '@/features/client-orders/components/client-orders-panel';
import { useCurrentUser } from '@/features/auth/api/get-current-user';

export function OrdersRoute() {
  const { data: user } = useCurrentUser();
  const organisationName = user?.organisation?.name ?? null;
  return (
    <div className="space-y-6">
      <title>Orders and certificates · Paraxia</title>
      <PageHeader kicker={organisationName ?? 'Your orders'} title="Your orders and certificates">
        The lenses you sent for measurement, their results and the certificates issued for them.
      </PageHeader>
      <RegionErrorBoundary region="Orders and certificates">
        <ClientOrdersPanel organisationName={organisationName} />
      </RegionErrorBoundary>
    </div>
  );
}
