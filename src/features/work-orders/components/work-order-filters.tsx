import { useEffect, useId, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { workOrderStatuses, type OrganisationSummary, type WorkOrderStatus } from '@shared/schemas/work-orders';
import { WORK_ORDER_STATUS_WORDS } from '@/features/work-orders/components/work-order-status-mark';
import { hasActiveFilters, type WorkOrderListChange, type WorkOrderListState } from '@/features/work-orders/lib/work-order-list-state';

/** Long enough to let a person finish a word, short enough to feel live. */
export const SEARCH_DEBOUNCE_MS = 350;

export interface WorkOrderFiltersProps {
  state: WorkOrderListState;
  onChange: (change: WorkOrderListChange, options?: { replace?: boolean }) => void;
  /** Client organisations to filter by; null hides the filter (a client sees only its own). */
  organisations: readonly OrganisationSummary[] | null;
}

const controlClass = 'h-8 rounded-sheet border border-rule-strong bg-sheet px-2 text-small text-ink';

export function WorkOrderFilters({ state, onChange, organisations }: WorkOrderFiltersProps) {
  const ids = { q: useId(), status: useId(), client: useId(), due: useId() };
  const [draftQuery, setDraftQuery] = useState(state.q);
  const committedQuery = useRef(state.q);

  // Back/forward or a pasted link changes the URL under the field: show what the URL says.
  useEffect(() => {
    if (state.q !== committedQuery.current) {
      committedQuery.current = state.q;
      setDraftQuery(state.q);
    }
  }, [state.q]);

  useEffect(() => {
    if (draftQuery.trim() === committedQuery.current.trim()) return;
    const timer = window.setTimeout(() => {
      committedQuery.current = draftQuery;
      onChange({ kind: 'search', q: draftQuery });
    }, SEARCH_DEBOUNCE_MS);
    return () => window.clearTimeout(timer);
  }, [draftQuery, onChange]);

  return (
    <form
      role="search"
      aria-label="Find work orders"
      className="flex flex-wrap items-end gap-x-4 gap-y-3 rounded-sheet border border-rule bg-sheet px-3 py-2.5"
      onSubmit={(event) => {
        event.preventDefault();
        committedQuery.current = draftQuery;
        onChange({ kind: 'search', q: draftQuery });
      }}
    >
      <div className="flex min-w-64 flex-1 flex-col gap-1">
        <label htmlFor={ids.q} className="text-caption font-semibold uppercase tracking-wider text-ink-faint">
          Search
        </label>
        <input
          id={ids.q}
          type="search"
          value={draftQuery}
          onChange={(event) => setDraftQuery(event.target.value)}
          placeholder="number, title, client, reference, lens identifier…"
          className={`${controlClass} w-full`}
        />
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={ids.status} className="text-caption font-semibold uppercase tracking-wider text-ink-faint">
          Status
        </label>
        <select
          id={ids.status}
          value={state.status ?? ''}
          onChange={(event) => onChange({ kind: 'status', status: (event.target.value || null) as WorkOrderStatus | null })}
          className={controlClass}
        >
          <option value="">Any status</option>
          {workOrderStatuses.map((status) => (
            <option key={status} value={status}>
              {WORK_ORDER_STATUS_WORDS[status]}
            </option>
          ))}
        </select>
      </div>
      {organisations ? (
        <div className="flex flex-col gap-1">
          <label htmlFor={ids.client} className="text-caption font-semibold uppercase tracking-wider text-ink-faint">
            Client
          </label>
          <select
            id={ids.client}
            value={state.organisationId ?? ''}
            onChange={(event) => onChange({ kind: 'organisation', organisationId: event.target.value || null })}
            className={`${controlClass} max-w-64`}
          >
            <option value="">Every client</option>
            {organisations.map((organisation) => (
              <option key={organisation.id} value={organisation.id}>
                {organisation.name}
              </option>
            ))}
          </select>
        </div>
      ) : null}
      <div className="flex flex-col gap-1">
        <label htmlFor={ids.due} className="text-caption font-semibold uppercase tracking-wider text-ink-faint">
          Due on or before
        </label>
        <input
          id={ids.due}
          type="date"
          value={state.dueBefore ?? ''}
          onChange={(event) => onChange({ kind: 'due-before', dueBefore: event.target.value || null })}
          className={`${controlClass} numerals`}
        />
      </div>
      {hasActiveFilters(state) ? (
        <Button
          variant="quiet"
          size="sm"
          onClick={() => {
            committedQuery.current = '';
            setDraftQuery('');
            onChange({ kind: 'clear-filters' });
          }}
        >
          Clear filters
        </Button>
      ) : null}
    </form>
  );
}
