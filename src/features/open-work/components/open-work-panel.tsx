import { EmptyState } from '@/components/ui/empty-state';
import { SafetyNote } from '@/components/ui/safety-note';
import { ConvergingLensIllustration } from '@/components/illustrations/converging-lens';

/** The technician's bench list. Work orders are not built yet, so it is honestly empty. */
export function OpenWorkPanel() {
  return (
    <div className="space-y-4">
      <SafetyNote context="bench" />
      <EmptyState
        illustration={<ConvergingLensIllustration />}
        title="No open work on the bench"
        willShow={[
          'Lenses waiting to be measured, grouped by work order and due date',
          'Measurements still in draft, with the sweep you stopped at',
          'Measurements a reviewer returned, with their comments',
        ]}
      >
        <p>
          When a work order reaches the lab, each lens on it appears here as a task for the bench. Open one to set up a
          measurement, upload the through-focus frames and their rail readings, and start the analysis.
        </p>
      </EmptyState>
    </div>
  );
}
