import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { OpenWorkPanel } from '@/features/open-work/components/open-work-panel';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { MeasurementStatusMark } from '@/features/measurements/components/measurement-status-mark';

export function BenchRoute() {
  const { data: user } = useCurrentUser();
  return (
    <div className="space-y-6">
      <title>Open work · Paraxia</title>
      <PageHeader kicker="Bench" title="Open work">
        {user ? <>Lenses and measurements waiting for you, {user.name.split(' ')[0]}.</> : null}
      </PageHeader>
      <RegionErrorBoundary region="Open work">
        <OpenWorkPanel statusMark={(status) => <MeasurementStatusMark status={status} />} />
      </RegionErrorBoundary>
    </div>
  );
}
