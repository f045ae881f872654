import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { ReviewQueuePanel } from '@/features/review-queue/components/review-queue-panel';

export function ReviewRoute() {
  return (
    <div className="space-y-6">
      <title>Review queue · Paraxia</title>
      <PageHeader kicker="Review" title="Review queue">
        Measurements submitted for a second pair of eyes before a certificate is issued.
      </PageHeader>
      <RegionErrorBoundary region="Review queue">
        <ReviewQueuePanel />
      </RegionErrorBoundary>
    </div>
  );
}
