import { Button } from '@/components/ui/button';

export interface PagerProps {
  /** What the rows are, for the navigation's label, e.g. "people". */
  what: string;
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
}

/** "41–60 of 212" with previous and next; for server-paged tables. */
export function Pager({ what, page, pageSize, total, onPage }: PagerProps) {
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav aria-label={`Pages of ${what}`} className="flex flex-wrap items-center justify-between gap-3 text-small">
      <p className="numerals text-ink-soft" aria-live="polite">
        {total === 0 ? `No ${what}` : `${first}–${last} of ${total} ${what}`}
      </p>
      <div className="flex items-center gap-1">
        <Button variant="secondary" size="sm" onClick={() => onPage(page - 1)} disabled={page <= 1}>
          ‹ Previous
        </Button>
        <span className="numerals px-2 text-ink-soft">
          page <span className="text-ink">{Math.min(page, pageCount)}</span> of {pageCount}
        </span>
        <Button variant="secondary" size="sm" onClick={() => onPage(page + 1)} disabled={page >= pageCount}>
          Next ›
        </Button>
      </div>
    </nav>
  );
}
