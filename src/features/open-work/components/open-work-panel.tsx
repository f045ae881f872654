import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { MeasurementStatus } from '@shared/schemas/measurements';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { Quantity } from '@/components/ui/quantity';
import { SafetyNote } from '@/components/ui/safety-note';
import { ConvergingLensIllustration } from '@/components/illustrations/converging-lens';
import { useMyOpenMeasurements } from '@/features/open-work/api/get-my-measurements';
import { groupOpenMeasurements } from '@/features/open-work/utils/group-open-measurements';

const METHOD_WORDS: Record<string, string> = {
  'finite-conjugate': 'finite conjugate',
  'multi-conjugate': 'multi-conjugate',
  displacement: 'displacement',
  collimator: 'collimator',
  'auxiliary-lens': 'auxiliary lens',
};

function updatedText(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  return date.toLocaleString('en-GB', { day: '2-digit', month: 'short', hour: '2-digit', minute: '2-digit' });
}

export interface OpenWorkPanelProps {
  /** Draws a status by word and symbol; given by the page, which composes it from the measurements feature. */
  statusMark: (status: MeasurementStatus) => ReactNode;
}

/** The technician's own measurements that are not finished, grouped by what they need next. */
export function OpenWorkPanel({ statusMark }: OpenWorkPanelProps) {
  const measurements = useMyOpenMeasurements();
  return (
    <div className="space-y-5">
      <SafetyNote context="bench" />
      {measurements.isPending ? <LoadingNote what="your measurements" /> : null}
      {measurements.isError ? (
        <ProblemNote
          title="Your measurements could not be loaded"
          message={measurements.error.message}
          action={
            <Button variant="secondary" size="sm" onClick={() => measurements.refetch()} isBusy={measurements.isFetching}>
              Try again
            </Button>
          }
        />
      ) : null}
      {measurements.data && measurements.data.items.length === 0 ? (
        <EmptyState illustration={<ConvergingLensIllustration />} title="No open measurements">
          <p>
            A measurement starts from a lens: open a{' '}
            <Link to="/work-orders" className="underline decoration-rule-strong underline-offset-4 hover:text-ink">
              work order
            </Link>
            , choose the lens, and press “Measure”. It then waits here until a reviewer has approved it.
          </p>
        </EmptyState>
      ) : null}
      {measurements.data
        ? groupOpenMeasurements(measurements.data.items).map((group) => (
            <section key={group.status} aria-label={group.status} className="space-y-2" data-group={group.status}>
              <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                {statusMark(group.status)}
                <span className="numerals text-small text-ink-faint">{group.items.length}</span>
                <p className="text-small text-ink-soft">{group.nextStep}</p>
              </div>
              <ul className="divide-y divide-rule overflow-hidden rounded-sheet border border-rule bg-sheet">
                {group.items.map((item) => (
                  <li key={item.id} className="grid items-baseline gap-x-4 px-4 py-2 text-small sm:grid-cols-[9rem_minmax(0,1fr)_10rem_auto]">
                    <Link to={`/measurements/${item.id}`} className="numerals font-semibold text-ink underline decoration-rule-strong underline-offset-4 hover:decoration-ink">
                      {item.number}
                    </Link>
                    <span className="min-w-0 truncate text-ink">
                      <span className="numerals font-medium">{item.lens.identifier}</span>
                      <span className="text-ink-faint"> · {METHOD_WORDS[item.method] ?? item.method} · </span>
                      <Link to={`/work-orders/${item.workOrder.id}`} className="numerals text-ink-soft underline decoration-rule underline-offset-4 hover:text-ink">
                        {item.workOrder.number}
                      </Link>
                    </span>
                    <span className="text-right">
                      {item.focalLengthMm !== null && item.expandedUncertaintyMm !== null ? (
                        <Quantity value={item.focalLengthMm} uncertainty={item.expandedUncertaintyMm} unit="mm" />
                      ) : (
                        <span className="text-ink-faint">no result yet</span>
                      )}
                    </span>
                    <span className="numerals text-right text-caption text-ink-faint">{updatedText(item.updatedAt)}</span>
                  </li>
                ))}
              </ul>
            </section>
          ))
        : null}
      {measurements.data && measurements.data.total > measurements.data.items.length ? (
        <p className="text-small text-ink-faint">
          Showing the {measurements.data.items.length} most recently changed of {measurements.data.total} open measurements.
        </p>
      ) : null}
    </div>
  );
}
