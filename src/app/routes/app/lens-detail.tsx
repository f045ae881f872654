import { Link, useParams } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { PageHeader } from '@/components/ui/page-header';
import { ProblemNote } from '@/components/ui/problem-note';
import { Section } from '@/components/ui/section';
import { isApiError } from '@/lib/api-client';
import { hasAnyRole } from '@/lib/authorization';
import { invariant } from '@/lib/invariant';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { useLens } from '@/features/lenses/api/get-lens';
import { LensFacts } from '@/features/lenses/components/lens-facts';
import { MeasurementHistoryTable } from '@/features/lenses/components/measurement-history-table';
import { PartNumberSpreadPanel } from '@/features/lenses/components/part-number-spread-panel';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function LensDetailRoute() {
  const { lensId } = useParams();
  invariant(lensId, 'the lens route has a :lensId segment');
  const { data: user } = useCurrentUser();
  const addressIsAnId = UUID.test(lensId);
  const lens = useLens(lensId, { enabled: addressIsAnId });
  const isLabStaff = user ? hasAnyRole(user, ['technician', 'reviewer', 'admin']) : false;
  const canMeasure = user ? hasAnyRole(user, ['technician']) : false;

  if (!addressIsAnId || lens.isError) {
    const notFound = !addressIsAnId || (isApiError(lens.error) && lens.error.status === 404);
    const message = !addressIsAnId
      ? 'The address does not end in a lens’s id; the link may have been cut short. Find the lens on its work order instead.'
      : (lens.error?.message ?? '');
    return (
      <div className="space-y-4">
        <title>Lens · Paraxia</title>
        <Link to="/work-orders" className="text-small text-ink-soft underline decoration-rule-strong underline-offset-4 hover:text-ink">
          ← All work orders
        </Link>
        <ProblemNote
          title={notFound ? 'There is no lens at this address' : 'The lens could not be loaded'}
          message={message}
          action={
            notFound ? null : (
              <Button variant="secondary" size="sm" onClick={() => lens.refetch()} isBusy={lens.isFetching}>
                Load again
              </Button>
            )
          }
        />
      </div>
    );
  }

  if (lens.isPending) return <LoadingNote what="the lens" />;
  const item = lens.data;
  return (
    <div className="space-y-8">
      <title>{`Lens ${item.identifier} · Paraxia`}</title>
      <div className="space-y-4">
        <nav aria-label="Where this lens belongs" className="flex flex-wrap items-baseline gap-1.5 text-small text-ink-soft">
          <Link to="/work-orders" className="underline decoration-rule-strong underline-offset-4 hover:text-ink">
            Work orders
          </Link>
          <span aria-hidden="true">/</span>
          <Link to={`/work-orders/${item.workOrder.id}`} className="numerals underline decoration-rule-strong underline-offset-4 hover:text-ink">
            {item.workOrder.number}
          </Link>
          <span className="text-ink-faint">
            {item.workOrder.title} · {item.workOrder.organisation.name}
          </span>
        </nav>
        <PageHeader
          kicker="Lens"
          title={item.identifier}
          actions={
            canMeasure ? (
              <Link
                to={`/measurements/new?lensId=${encodeURIComponent(item.id)}`}
                className="inline-flex h-10 items-center rounded-sheet border border-ink bg-ink px-4 text-body font-medium text-sheet hover:bg-ink-soft"
              >
                New measurement
              </Link>
            ) : null
          }
        />
        <LensFacts lens={item} />
      </div>

      <Section
        title="Measurements"
        description={isLabStaff ? 'Every measurement of this lens; open one for its focus curves, budget and review.' : 'Every measurement of this lens and its result.'}
      >
        <RegionErrorBoundary region="Measurements">
          <MeasurementHistoryTable measurements={item.measurements} linkToMeasurements={isLabStaff} />
        </RegionErrorBoundary>
      </Section>

      {item.partNumber && isLabStaff ? (
        <Section
          title={`Batch of part ${item.partNumber}`}
          description="The latest analysed focal length of every lens with this part number, against its tolerance band."
        >
          <RegionErrorBoundary region="Batch spread">
            <PartNumberSpreadPanel partNumber={item.partNumber} decisionRule={item.workOrder.decisionRule} currentLensId={item.id} />
          </RegionErrorBoundary>
        </Section>
      ) : null}
    </div>
  );
}
