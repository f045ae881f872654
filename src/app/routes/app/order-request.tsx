import { useNavigate } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { WorkRequestForm } from '@/features/work-requests/components/work-request-form';

function todayIsoDate(): string {
  return new Date().toISOString().slice(0, 10);
}

export function OrderRequestRoute() {
  const navigate = useNavigate();
  return (
    <div className="space-y-6">
      <title>Request new work · Paraxia</title>
      <PageHeader kicker="Your orders" title="Request new work">
        List the lenses you want measured with their nominal focal length and tolerance. The lab receives the request,
        checks it and opens the work order; you follow it under Orders.
      </PageHeader>
      <RegionErrorBoundary region="Work request">
        <WorkRequestForm
          todayIsoDate={todayIsoDate()}
          onCreated={({ workOrder }) => navigate('/orders', { state: { requestedWorkOrderNumber: workOrder.number } })}
          onCancel={() => navigate('/orders')}
        />
      </RegionErrorBoundary>
    </div>
  );
}
