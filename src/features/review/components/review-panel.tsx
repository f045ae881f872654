import { useState } from 'react';
import type { MeasurementDetail } from '@shared/schemas/measurements';
import { fourEyesRefusal, REVIEW_REMARK_MAX_LENGTH, type ReviewEntry } from '@shared/schemas/review';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { ProblemNote } from '@/components/ui/problem-note';
import type { User } from '@/types/api';
import { useAddReviewComment } from '../api/add-review-comment';
import { useReviewEntries } from '../api/get-review-entries';
import { useReviewTransition } from '../api/review-transition';

const ENTRY_KIND_WORDS: Record<ReviewEntry['kind'], string> = {
  comment: 'Comment',
  submission: 'Submitted',
  return: 'Returned',
  approval: 'Approved',
};

const textareaClass = 'w-full rounded-sheet border border-rule-strong bg-sheet px-3 py-2 text-body text-ink';

export function formatInstant(iso: string): string {
  return new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

function hasRole(user: User, roles: string[]): boolean {
  return user.roles.some((role) => roles.includes(role));
}

/** The path so far, one step per recorded transition. */
function ReviewStatusLine({ measurement }: { measurement: MeasurementDetail }) {
  const { review, status } = measurement;
  const steps: { label: string; detail: string | null; done: boolean }[] = [
    { label: 'Analysed', detail: measurement.currentAnalysis ? `v${measurement.currentAnalysis.version}` : null, done: measurement.currentAnalysis !== null },
    {
      label: status === 'returned' ? 'Returned to the bench' : 'Submitted',
      detail: review.submittedBy && review.submittedAt ? `${review.submittedBy.name}, ${formatInstant(review.submittedAt)}` : null,
      done: ['submitted', 'approved', 'certified', 'returned'].includes(status),
    },
    {
      label: 'Approved',
      detail: review.approvedBy && review.approvedAt ? `${review.approvedBy.name}, ${formatInstant(review.approvedAt)}` : null,
      done: ['approved', 'certified'].includes(status),
    },
    { label: 'Certified', detail: measurement.certificates[0] ? `${measurement.certificates[0].number} rev ${measurement.certificates[0].revision}` : null, done: status === 'certified' },
  ];
  return (
    <ol aria-label="Where this measurement stands in review" className="flex flex-wrap gap-2 text-small">
      {steps.map((step, index) => (
        <li
          key={step.label}
          data-done={step.done || undefined}
          className={`flex items-baseline gap-2 rounded-sheet border px-3 py-1.5 ${step.done ? 'border-ink/40 bg-sheet text-ink' : 'border-dashed border-rule-strong text-ink-faint'}`}
        >
          <span className="numerals text-caption text-ink-faint">{index + 1}</span>
          <span className="font-medium">{step.label}</span>
          {step.detail && step.done ? <span className="text-ink-soft">{step.detail}</span> : null}
        </li>
      ))}
    </ol>
  );
}

function ReviewActions({ measurement, user }: { measurement: MeasurementDetail; user: User }) {
  const [returnComment, setReturnComment] = useState('');
  const submit = useReviewTransition(measurement.id, 'submission');
  const approve = useReviewTransition(measurement.id, 'approval');
  const giveBack = useReviewTransition(measurement.id, 'return');
  const isTechnician = hasRole(user, ['technician']);
  const isReviewer = hasRole(user, ['reviewer', 'admin']);
  const fourEyes = fourEyesRefusal(
    { number: measurement.number, performedById: measurement.performedBy?.id ?? null, submittedById: measurement.review.submittedBy?.id ?? null },
    user.id,
    'approve',
  );
  const failure = submit.error ?? approve.error ?? giveBack.error;

  if (measurement.status === 'certified') {
    return (
      <p role="note" className="rounded-sheet border border-ink/30 bg-sheet px-4 py-3 text-small text-ink">
        This measurement is certified and read-only: its set-up, frames, readings and analyses can no longer change. A correction is made by
        reissuing the certificate with a reason.
      </p>
    );
  }

  const canSubmit = isTechnician && (measurement.status === 'analysed' || measurement.status === 'returned');
  const canReview = isReviewer && measurement.status === 'submitted';
  return (
    <div className="space-y-3">
      {canSubmit ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button onClick={() => submit.mutate({})} isBusy={submit.isPending}>
            Submit for review
          </Button>
          <span className="text-small text-ink-faint">A reviewer who did not take part checks analysis v{measurement.currentAnalysis?.version} before a certificate is issued.</span>
        </div>
      ) : null}
      {canReview ? (
        <div className="space-y-3 rounded-sheet border border-rule bg-sheet px-4 py-3">
          <div className="flex flex-wrap items-center gap-3">
            <Button onClick={() => approve.mutate({})} isBusy={approve.isPending} disabled={fourEyes !== null}>
              Approve
            </Button>
            {fourEyes ? <span className="text-small text-ink-soft">{fourEyes}</span> : null}
          </div>
          <div className="space-y-1.5">
            <label htmlFor="return-comment" className="text-small font-medium text-ink">
              Return to the technician with a comment
            </label>
            <textarea
              id="return-comment"
              rows={2}
              maxLength={REVIEW_REMARK_MAX_LENGTH}
              value={returnComment}
              onChange={(event) => setReturnComment(event.target.value)}
              className={textareaClass}
              placeholder="What should change before this can be approved"
            />
            <Button
              variant="secondary"
              size="sm"
              disabled={returnComment.trim() === ''}
              isBusy={giveBack.isPending}
              onClick={() => giveBack.mutate({ comment: returnComment }, { onSuccess: () => setReturnComment('') })}
            >
              Return with comment
            </Button>
          </div>
        </div>
      ) : null}
      {!canSubmit && !canReview && measurement.status !== 'approved' ? (
        <p className="text-small text-ink-faint">
          {measurement.status === 'submitted'
            ? 'Waiting for a reviewer.'
            : measurement.status === 'returned'
              ? 'Returned: the technician answers the comments, re-analyses if needed and submits again.'
              : 'Nothing to review yet: a measurement is submitted once it has a succeeded analysis.'}
        </p>
      ) : null}
      {failure ? <ProblemNote title="The review step was not recorded" message={failure.message} /> : null}
    </div>
  );
}

function ReviewThread({ measurementId }: { measurementId: string }) {
  const entries = useReviewEntries(measurementId);
  const add = useAddReviewComment(measurementId);
  const [draft, setDraft] = useState('');
  if (entries.isPending) return <LoadingNote what="the review thread" />;
  if (entries.isError) return <ProblemNote title="The review thread could not be loaded" message={entries.error.message} />;
  return (
    <div className="space-y-3">
      {entries.data.length === 0 ? (
        <p className="text-small text-ink-faint">No comments yet.</p>
      ) : (
        <ol aria-label="Review thread" className="space-y-2">
          {entries.data.map((entry) => (
            <li key={entry.id} data-kind={entry.kind} className={`rounded-sheet border bg-sheet px-4 py-2.5 ${entry.kind === 'return' ? 'border-undecided/60' : 'border-rule'}`}>
              <p className="flex flex-wrap items-baseline gap-x-2 text-caption text-ink-faint">
                <span className="font-semibold uppercase tracking-wider text-ink-soft">{ENTRY_KIND_WORDS[entry.kind]}</span>
                <span className="text-ink">{entry.author?.name ?? 'Former user'}</span>
                {entry.author ? <span>{entry.author.roles.join(', ')}</span> : null}
                <span className="numerals">{formatInstant(entry.createdAt)}</span>
                {entry.analysisVersion !== null ? <span className="numerals">about analysis v{entry.analysisVersion}</span> : null}
              </p>
              <p className="mt-1 whitespace-pre-wrap text-small text-ink">{entry.body}</p>
            </li>
          ))}
        </ol>
      )}
      <form
        className="space-y-1.5"
        onSubmit={(event) => {
          event.preventDefault();
          if (draft.trim()) add.mutate(draft, { onSuccess: () => setDraft('') });
        }}
      >
        <label htmlFor="review-comment" className="text-small font-medium text-ink">
          Add a comment
        </label>
        <textarea id="review-comment" rows={2} maxLength={REVIEW_REMARK_MAX_LENGTH} value={draft} onChange={(event) => setDraft(event.target.value)} className={textareaClass} />
        <Button type="submit" variant="secondary" size="sm" disabled={draft.trim() === ''} isBusy={add.isPending}>
          Post comment
        </Button>
        {add.error ? <ProblemNote title="The comment was not posted" message={add.error.message} /> : null}
      </form>
    </div>
  );
}

/** The measurement's review: where it stands, what the viewer may do next, and the thread. */
export function ReviewPanel({ measurement, user }: { measurement: MeasurementDetail; user: User }) {
  return (
    <div className="space-y-4">
      <ReviewStatusLine measurement={measurement} />
      <ReviewActions measurement={measurement} user={user} />
      <ReviewThread measurementId={measurement.id} />
    </div>
  );
}
