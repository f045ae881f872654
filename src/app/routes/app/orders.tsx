import { useLocation } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { CircleTickGlyph } from '@/components/ui/mark-glyphs';
import { PageHeader } from '@/components/ui/page-header';
import { ClientOrdersPanel } from '@/features/client-orders/components/client-orders-panel';
import { useCurrentUser } from '@/features/auth/api/get-current-user';

export function OrdersRoute() {
  const { data: user } = useCurrentUser();
  const location = useLocation();
  const requested = (location.state as { requestedWorkOrderNumber?: string } | null)?.requestedWorkOrderNumber;
  const organisationName = user?.organisation?.name ?? null;
  return (
    <div className="space-y-6">
      <title>Orders and certificates · Paraxia</title>
      <PageHeader kicker={organisationName ?? 'Your orders'} title="Your orders and certificates">
        The lenses you sent for measurement, their results and the certificates issued for them.
      </PageHeader>
      {requested ? (
        <p role="status" className="flex items-center gap-2 rounded-sheet border border-rule-strong bg-sheet px-4 py-2.5 text-body text-ink shadow-sheet">
          <CircleTickGlyph className="size-4 shrink-0" />
          <span>
            Request sent: work order <span className="font-mono">{requested}</span> is with the lab, which will confirm it.
          </span>
        </p>
      ) : null}
      <RegionErrorBoundary region="Orders and certificates">
        <ClientOrdersPanel organisationName={organisationName} />
      </RegionErrorBoundary>
    </div>
  );
}
