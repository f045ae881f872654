import { useId } from 'react';
import { Button } from '@/components/ui/button';
import {
  describeListRange,
  listRange,
  PAGE_SIZE_CHOICES,
  type PageSizeChoice,
} from '@/features/work-orders/lib/work-order-list-state';

export interface ListPaginationProps {
  page: number;
  pageSize: PageSizeChoice;
  total: number;
  onPage: (page: number) => void;
  onPageSize: (pageSize: PageSizeChoice) => void;
}

export function ListPagination({ page, pageSize, total, onPage, onPageSize }: ListPaginationProps) {
  const sizeId = useId();
  const range = listRange({ page, pageSize, total });
  return (
    <nav aria-label="Pages of work orders" className="flex flex-wrap items-center justify-between gap-3 text-small">
      <p className="numerals text-ink-soft" aria-live="polite">
        {describeListRange(range)}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <div className="flex items-center gap-2">
          <label htmlFor={sizeId} className="text-ink-soft">
            Rows per page
          </label>
          <select
            id={sizeId}
            value={pageSize}
            onChange={(event) => onPageSize(Number(event.target.value) as PageSizeChoice)}
            className="numerals h-8 rounded-sheet border border-rule-strong bg-sheet px-2 text-small"
          >
            {PAGE_SIZE_CHOICES.map((size) => (
              <option key={size} value={size}>
                {size}
              </option>
            ))}
          </select>
        </div>
        <div className="flex items-center gap-1">
          <Button variant="secondary" size="sm" onClick={() => onPage(1)} disabled={page <= 1} aria-label="First page">
            «
          </Button>
          <Button variant="secondary" size="sm" onClick={() => onPage(page - 1)} disabled={page <= 1}>
            ‹ Previous
          </Button>
          <span className="numerals px-2 text-ink-soft">
            page <span className="text-ink">{Math.min(page, range.pageCount)}</span> of {range.pageCount}
          </span>
          <Button variant="secondary" size="sm" onClick={() => onPage(page + 1)} disabled={page >= range.pageCount}>
            Next ›
          </Button>
          <Button variant="secondary" size="sm" onClick={() => onPage(range.pageCount)} disabled={page >= range.pageCount} aria-label="Last page">
            »
          </Button>
        </div>
      </div>
    </nav>
  );
}
