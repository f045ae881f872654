import type { WorkOrderStatus } from '@shared/schemas/work-orders';
import { workOrderDueState } from '@/features/work-orders/lib/work-order-due';

/** An hourglass run out: "late", told by shape and words as well as colour. */
function LateGlyph() {
  return (
    <svg viewBox="0 0 16 16" className="size-3.5 shrink-0" aria-hidden="true" focusable="false" data-glyph="late">
      <path d="M4 1.8h8M4 14.2h8M5 1.8c0 3.4 6 4.6 6 12.4M11 1.8c0 3.4-6 4.6-6 12.4" fill="none" stroke="currentColor" strokeWidth={1.4} strokeLinecap="round" />
      <path d="M5.6 13.6c.6-2 1.4-2.8 2.4-2.8s1.8.8 2.4 2.8Z" fill="currentColor" />
    </svg>
  );
}

export interface DueDateTextProps {
  dueDate: string | null;
  status: WorkOrderStatus;
  todayIsoDate: string;
  /** `stacked` puts the note under the date, for narrow table columns. */
  layout?: 'inline' | 'stacked';
}

/** A due date in tabular figures; an open order past it is marked "late" with the days it is over. */
export function DueDateText({ dueDate, status, todayIsoDate, layout = 'inline' }: DueDateTextProps) {
  const box = layout === 'stacked' ? 'flex-col items-start gap-0' : 'items-baseline gap-1.5';
  if (dueDate === null) return <span className="text-ink-faint">none set</span>;
  const due = workOrderDueState({ dueDate, status, todayIsoDate });
  if (due.standing === 'overdue') {
    return (
      <span className={`inline-flex whitespace-nowrap font-semibold text-nonconform ${box}`} data-due="overdue">
        <span className="inline-flex items-center gap-1.5">
          <LateGlyph />
          <span className="numerals">{dueDate}</span>
        </span>
        <span className={`font-sans text-caption font-medium ${layout === 'stacked' ? 'pl-5' : ''}`}>{due.note}</span>
      </span>
    );
  }
  return (
    <span className={`inline-flex whitespace-nowrap ${box}`} data-due={due.standing}>
      <span className={`numerals ${due.standing === 'closed' ? 'text-ink-soft' : 'text-ink'}`}>{dueDate}</span>
      {due.note ? (
        <span className={`font-sans text-caption ${due.standing === 'due-today' ? 'font-semibold text-ink' : 'text-ink-faint'}`}>{due.note}</span>
      ) : null}
    </span>
  );
}
