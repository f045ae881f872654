import { useState } from 'react';
import { Link } from 'react-router-dom';
import { CertificateSheetIllustration } from '@/components/illustrations/certificate-sheet';
import { EmptyState } from '@/components/ui/empty-state';
import { LoadingNote } from '@/components/ui/loading-note';
import { Pager } from '@/components/ui/pager';
import { ProblemNote } from '@/components/ui/problem-note';
import { SafetyNote } from '@/components/ui/safety-note';
import { workOrderStatuses } from '@shared/schemas/work-orders';
import { usePortalOrders, type PortalOrdersFilter } from '@/features/client-orders/api/get-portal-orders';
import { ClientOrderCard } from '@/features/client-orders/components/client-order-card';
import { ORDER_STATUS_WORDS } from '@/features/client-orders/lib/client-words';

export interface ClientOrdersPanelProps {
  /** The client's organisation, as the lab knows it. */
  organisationName: string | null;
}

/** A client's work orders with their lenses, results and certificates; only their own organisation's. */
export function ClientOrdersPanel({ organisationName }: ClientOrdersPanelProps) {
  const [filter, setFilter] = useState<PortalOrdersFilter>({ q: '', status: '', page: 1 });
  const orders = usePortalOrders(filter);
  const who = organisationName ?? 'your organisation';
  const filtered = filter.q.trim() !== '' || filter.status !== '';

  const controls = (
    <div className="flex flex-wrap items-end gap-3">
      <label className="flex flex-col gap-1 text-small font-medium text-ink">
        Search
        <input
          type="search"
          value={filter.q}
          placeholder="Order, title, your reference or lens"
          onChange={(event) => setFilter({ ...filter, q: event.target.value, page: 1 })}
          className="h-9 w-72 rounded-sheet border border-rule-strong bg-sheet px-3 text-body font-normal placeholder:text-ink-faint/70"
        />
      </label>
      <label className="flex flex-col gap-1 text-small font-medium text-ink">
        Status
        <select
          value={filter.status}
          onChange={(event) => setFilter({ ...filter, status: event.target.value, page: 1 })}
          className="h-9 rounded-sheet border border-rule-strong bg-sheet px-2 text-body font-normal"
        >
          <option value="">Every status</option>
          {workOrderStatuses.map((status) => (
            <option key={status} value={status}>
              {ORDER_STATUS_WORDS[status]}
            </option>
          ))}
        </select>
      </label>
      <Link to="/orders/request" className="ml-auto inline-flex h-9 items-center rounded-sheet border border-ink bg-ink px-4 text-small font-medium text-sheet hover:bg-ink-soft">
        Request new work
      </Link>
    </div>
  );

  if (orders.isPending) return <LoadingNote what="your orders" />;
  if (orders.isError) return <ProblemNote title="Your orders could not be loaded" message={orders.error.message} />;
  const { items, total, page, pageSize } = orders.data;

  if (total === 0 && !filtered) {
    return (
      <div className="space-y-4">
        {controls}
        <EmptyState
          illustration={<CertificateSheetIllustration />}
          title={`No orders from ${who} yet`}
          willShow={[
            'Each work order with its lenses, due date and where it stands',
            'A results summary per lens: focal length, uncertainty and conformity',
            'Certificates to download as PDF, each with a code anyone can verify',
          ]}
        >
          <p>
            Request new work, or wait for the lab to open a work order for {who}; it appears here and you can follow it from
            the bench to the certificate. Only people of {who} see these records.
          </p>
        </EmptyState>
      </div>
    );
  }

  const firstCertified = items.find((order) => order.lenses.some((lens) => lens.measurements.some((m) => m.stage === 'certified')));
  return (
    <div className="space-y-4">
      {controls}
      {items.length === 0 ? <p className="text-small text-ink-faint">No order matches this search.</p> : null}
      <div className={`space-y-3 ${orders.isPlaceholderData ? 'opacity-60' : ''}`}>
        {items.map((order) => (
          <ClientOrderCard key={order.id} order={order} initiallyOpen={order.id === firstCertified?.id} />
        ))}
      </div>
      {total > pageSize ? <Pager what="orders" page={page} pageSize={pageSize} total={total} onPage={(next) => setFilter({ ...filter, page: next })} /> : null}
      <SafetyNote context="certificate" />
    </div>
  );
}
