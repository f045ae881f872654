import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { PageHeader } from '@/components/ui/page-header';
import { ProblemNote } from '@/components/ui/problem-note';
import { isApiError } from '@/lib/api-client';
import { useMeasurementLens } from '@/features/measurements/api/get-measurement-lens';
import { NewMeasurementForm } from '@/features/measurements/components/new-measurement-form';

const linkClass = 'underline decoration-rule-strong underline-offset-4 hover:text-ink';

/** `/measurements/new?lensId=…`: set up a measurement of one lens. */
export function NewMeasurementRoute() {
  const [searchParams] = useSearchParams();
  const lensId = searchParams.get('lensId');
  const navigate = useNavigate();
  const lens = useMeasurementLens(lensId);

  if (lensId === null || lensId.trim() === '') {
    return (
      <div className="space-y-4">
        <title>New measurement · Paraxia</title>
        <PageHeader kicker="Bench" title="New measurement" />
        <ProblemNote
          title="Which lens is to be measured?"
          message="A measurement is always of one lens. Open the lens from its work order and choose “Measure” there."
          action={
            <Link to="/work-orders" className={`text-small ${linkClass}`}>
              Go to the work orders
            </Link>
          }
        />
      </div>
    );
  }
  if (lens.isPending) return <LoadingNote what="the lens" />;
  if (lens.isError) {
    const notFound = isApiError(lens.error) && lens.error.status === 404;
    return (
      <div className="space-y-4">
        <title>New measurement · Paraxia</title>
        <PageHeader kicker="Bench" title="New measurement" />
        <ProblemNote
          title={notFound ? 'There is no lens with this id' : 'The lens could not be loaded'}
          message={lens.error.message}
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

  const item = lens.data;
  return (
    <div className="space-y-6">
      <title>{`New measurement of ${item.identifier} · Paraxia`}</title>
      <nav aria-label="Where this measurement belongs" className="flex flex-wrap items-baseline gap-1.5 text-small text-ink-soft">
        <Link to="/work-orders" className={linkClass}>
          Work orders
        </Link>
        <span aria-hidden="true">/</span>
        <Link to={`/work-orders/${item.workOrder.id}`} className={`numerals ${linkClass}`}>
          {item.workOrder.number}
        </Link>
        <span aria-hidden="true">/</span>
        <Link to={`/lenses/${item.id}`} className={`numerals ${linkClass}`}>
          {item.identifier}
        </Link>
        <span aria-hidden="true">/</span>
        <span className="text-ink">New measurement</span>
      </nav>
      <PageHeader kicker="Bench · set-up" title="New measurement">
        Choose how the bench is set up and what is on it. Frames and rail readings come next, on the measurement’s own page.
      </PageHeader>
      <RegionErrorBoundary region="The set-up form">
        <NewMeasurementForm
          lens={item}
          onCreated={(measurement) => navigate(`/measurements/${measurement.id}`)}
          onCancel={() => navigate(`/lenses/${item.id}`)}
        />
      </RegionErrorBoundary>
    </div>
  );
}
