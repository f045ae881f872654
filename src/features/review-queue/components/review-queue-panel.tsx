import { EmptyState } from '@/components/ui/empty-state';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import { FocusCurveIllustration } from '@/components/illustrations/focus-curve';
import { useReviewQueue } from '../api/get-review-queue';
import { ReviewQueueTable } from './review-queue-table';

/** The reviewer's queue: submitted measurements oldest first, then approved ones still without a certificate. */
export function ReviewQueuePanel() {
  const queue = useReviewQueue();
  if (queue.isPending) return <LoadingNote what="the review queue" />;
  if (queue.isError) return <ProblemNote title="The review queue could not be loaded" message={queue.error.message} />;
  const { submitted, awaitingCertificate } = queue.data;
  if (submitted.length === 0 && awaitingCertificate.length === 0) {
    return (
      <EmptyState
        illustration={<FocusCurveIllustration />}
        title="Nothing is waiting for review"
        willShow={[
          'Submitted measurements, oldest first, with the technician who ran them',
          'The focal length with its expanded uncertainty, and how long each has waited',
          'Approved measurements whose certificate is still to be issued',
        ]}
      >
        <p>A technician’s measurement lands here when they submit it. You cannot approve a measurement you performed or submitted yourself.</p>
      </EmptyState>
    );
  }
  return (
    <div className="space-y-6">
      <ReviewQueueTable caption="Submitted for review, oldest first" rows={submitted} since="submitted" emptyText="No measurement is waiting for review." />
      <ReviewQueueTable
        caption="Approved, certificate not yet issued"
        rows={awaitingCertificate}
        since="approved"
        emptyText="Every approved measurement has its certificate."
      />
    </div>
  );
}
