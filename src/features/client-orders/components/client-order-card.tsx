import { useId, useState } from 'react';
import type { PortalWorkOrder } from '@shared/schemas/portal';
import { OrderLensesTable } from '@/features/client-orders/components/order-lenses-table';
import { ORDER_STATUS_WORDS } from '@/features/client-orders/lib/client-words';

function certifiedCount(order: PortalWorkOrder): number {
  return order.lenses.filter((lens) => lens.measurements.some((measurement) => measurement.stage === 'certified')).length;
}

/** One work order as a sheet: its facts in a line, its lenses unfolded on demand. */
export function ClientOrderCard({ order, initiallyOpen }: { order: PortalWorkOrder; initiallyOpen: boolean }) {
  const [open, setOpen] = useState(initiallyOpen);
  const bodyId = useId();
  const certified = certifiedCount(order);
  return (
    <article className="overflow-hidden rounded-sheet border border-rule-strong bg-sheet shadow-sheet" data-work-order={order.number}>
      <button
        type="button"
        aria-expanded={open}
        aria-controls={bodyId}
        onClick={() => setOpen((value) => !value)}
        className="grid w-full grid-cols-[auto_1fr_auto] items-baseline gap-x-4 gap-y-1 px-4 py-3 text-left hover:bg-shade/50"
      >
        <span aria-hidden="true" className={`text-ink-faint transition-transform ${open ? 'rotate-90' : ''}`}>▸</span>
        <span className="min-w-0">
          <span className="font-mono text-small text-ink-soft">{order.number}</span>
          <span className="ml-3 font-serif text-title-sm text-ink">{order.title}</span>
        </span>
        <span className="text-small text-ink">{ORDER_STATUS_WORDS[order.status]}</span>
        <span />
        <span className="flex flex-wrap gap-x-5 text-caption text-ink-faint">
          <span>
            Your reference: <span className="font-mono text-ink-soft">{order.clientReference ?? '—'}</span>
          </span>
          <span>
            Due: {order.dueDate ? <span className="numerals text-ink-soft">{order.dueDate}</span> : <span className="text-ink-soft">not set</span>}
          </span>
          <span>
            <span className="numerals text-ink-soft">{order.lenses.length}</span> {order.lenses.length === 1 ? 'lens' : 'lenses'},{' '}
            <span className="numerals text-ink-soft">{certified}</span> certified
          </span>
        </span>
        <span className="text-caption text-ink-faint">{open ? 'Hide lenses' : 'Show lenses'}</span>
      </button>
      <div id={bodyId} hidden={!open} className="border-t border-rule">
        {open ? <OrderLensesTable lenses={order.lenses} /> : null}
      </div>
    </article>
  );
}
