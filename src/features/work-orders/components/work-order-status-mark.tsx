import type { WorkOrderStatus } from '@shared/schemas/work-orders';

export const WORK_ORDER_STATUS_WORDS: Record<WorkOrderStatus, string> = {
  requested: 'Requested',
  open: 'Open',
  'in-progress': 'In progress',
  completed: 'Completed',
  cancelled: 'Cancelled',
};

/**
 * A work order's stage as a circle that fills as the work advances (dotted,
 * empty, half, full) and a struck-through one when cancelled, so the status
 * reads from the shape without colour. Ink only: conformity and focus keep
 * their colours to themselves.
 */
function StatusGlyph({ status, className = 'size-3.5' }: { status: WorkOrderStatus; className?: string }) {
  const ring = { cx: 8, cy: 8, r: 6, fill: 'none', stroke: 'currentColor', strokeWidth: 1.5 };
  return (
    <svg viewBox="0 0 16 16" className={className} aria-hidden="true" focusable="false" data-glyph={`status-${status}`}>
      {status === 'requested' ? <circle {...ring} strokeDasharray="2.2 2.2" /> : null}
      {status === 'open' ? <circle {...ring} /> : null}
      {status === 'in-progress' ? (
        <>
          <circle {...ring} />
          <path d="M8 2a6 6 0 0 1 0 12Z" fill="currentColor" />
        </>
      ) : null}
      {status === 'completed' ? <circle {...ring} fill="currentColor" /> : null}
      {status === 'cancelled' ? (
        <>
          <circle {...ring} strokeWidth={1.2} opacity={0.75} />
          <path d="M3.6 12.4 12.4 3.6" stroke="currentColor" strokeWidth={1.5} strokeLinecap="round" />
        </>
      ) : null}
    </svg>
  );
}

export function WorkOrderStatusMark({ status }: { status: WorkOrderStatus }) {
  const muted = status === 'cancelled' || status === 'completed';
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap ${muted ? 'text-ink-soft' : 'text-ink'}`} data-status={status}>
      <StatusGlyph status={status} />
      <span>{WORK_ORDER_STATUS_WORDS[status]}</span>
    </span>
  );
}
