import type { SortOrder } from '@/features/work-orders/lib/work-order-list-state';

export interface SortHeaderProps {
  label: string;
  /** The order this column is sorted in, or null when another column leads. */
  activeOrder: SortOrder | null;
  onSort: () => void;
}

/** A column heading that sorts on click; the arrow and the spoken label say which way. */
export function SortHeader({ label, activeOrder, onSort }: SortHeaderProps) {
  const next = activeOrder === 'asc' ? 'descending' : 'ascending';
  const spoken =
    activeOrder === null ? `${label}: sort ascending` : `${label}, sorted ${activeOrder === 'asc' ? 'ascending' : 'descending'}: sort ${next}`;
  return (
    <button
      type="button"
      onClick={onSort}
      aria-label={spoken}
      data-sorted={activeOrder ?? undefined}
      className={`-mx-1 inline-flex items-center gap-1 rounded-hair px-1 uppercase tracking-wider hover:bg-sheet hover:text-ink ${
        activeOrder ? 'text-ink' : ''
      }`}
    >
      <span>{label}</span>
      <svg viewBox="0 0 10 12" className="size-2.5" aria-hidden="true" focusable="false">
        <path d="M5 1 8.5 4.6H1.5Z" fill="currentColor" opacity={activeOrder === 'asc' ? 1 : 0.28} />
        <path d="M5 11 1.5 7.4H8.5Z" fill="currentColor" opacity={activeOrder === 'desc' ? 1 : 0.28} />
      </svg>
    </button>
  );
}
