import { ConformityMark } from '@/components/ui/conformity-mark';
import { EmptyState } from '@/components/ui/empty-state';
import { Quantity } from '@/components/ui/quantity';
import { FocusCurveIllustration } from '@/components/illustrations/focus-curve';

/** The reviewer's queue of submitted measurements; empty until measurements exist. */
export function ReviewQueuePanel() {
  return (
    <div className="space-y-4">
      <EmptyState
        illustration={<FocusCurveIllustration />}
        title="Nothing is waiting for review"
        willShow={[
          'Submitted measurements, oldest first, with the technician who ran them',
          'The focus curve, focal length with its expanded uncertainty, and the uncertainty budget',
          'Approve or return with comments; certificates are issued from here once approved',
        ]}
      >
        <p>
          A technician’s measurement lands here when they submit it. You cannot approve a measurement you performed
          yourself; those go to another reviewer.
        </p>
      </EmptyState>
      <div className="rounded-sheet border border-rule bg-sheet px-4 py-3">
        <p className="text-caption font-semibold uppercase tracking-wider text-ink-faint">How results will read</p>
        <div className="mt-2 flex flex-wrap items-center gap-x-6 gap-y-2 text-small text-ink-soft">
          <span className="inline-flex items-baseline gap-2">
            focal length <Quantity value={99.93} uncertainty={0.12} unit="mm" />
          </span>
          <ConformityMark decision="conforms" size="sm" />
          <ConformityMark decision="does-not-conform" size="sm" />
          <ConformityMark decision="undecided" size="sm" />
        </div>
        <p className="mt-2 text-caption text-ink-faint">
          Under guarded acceptance (ILAC-G8), “Undecided” means the value lies within one expanded uncertainty of a tolerance limit, so neither decision is safe.
        </p>
      </div>
    </div>
  );
}
