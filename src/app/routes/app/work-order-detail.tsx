import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { Button } from '@/components/ui/button';
import { LoadingNote } from '@/components/ui/loading-note';
import { PageHeader } from '@/components/ui/page-header';
import { ProblemNote } from '@/components/ui/problem-note';
import { SafetyNote } from '@/components/ui/safety-note';
import { Section } from '@/components/ui/section';
import { isApiError } from '@/lib/api-client';
import { hasAnyRole } from '@/lib/authorization';
import { invariant } from '@/lib/invariant';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { AddLensForm } from '@/features/lenses/components/add-lens-form';
import { LensesTable } from '@/features/lenses/components/lenses-table';
import { useWorkOrder, workOrderQueryKey } from '@/features/work-orders/api/get-work-order';
import { workOrdersQueryKey } from '@/features/work-orders/api/get-work-orders';
import { WorkOrderFacts } from '@/features/work-orders/components/work-order-facts';
import { WorkOrderProgressForm } from '@/features/work-orders/components/work-order-progress-form';
import { useTodayIsoDate } from '@/features/work-orders/hooks/use-today';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function WorkOrderDetailRoute() {
  const { workOrderId } = useParams();
  invariant(workOrderId, 'the work-order route has a :workOrderId segment');
  const { data: user } = useCurrentUser();
  const queryClient = useQueryClient();
  const todayIsoDate = useTodayIsoDate();
  const addressIsAnId = UUID.test(workOrderId);
  const workOrder = useWorkOrder(workOrderId, { enabled: addressIsAnId });
  const [isEditing, setIsEditing] = useState(false);
  const [isAddingLens, setIsAddingLens] = useState(false);
  const canEdit = user ? hasAnyRole(user, ['technician', 'admin']) : false;
  const canMeasure = user ? hasAnyRole(user, ['technician']) : false;
  const isLabStaff = user ? hasAnyRole(user, ['technician', 'reviewer', 'admin']) : false;

  const backLink = (
    <Link to="/work-orders" className="text-small text-ink-soft underline decoration-rule-strong underline-offset-4 hover:text-ink">
      ← All work orders
    </Link>
  );

  if (!addressIsAnId) {
    return (
      <div className="space-y-4">
        <title>Work order · Paraxia</title>
        {backLink}
        <ProblemNote
          title="There is no work order at this address"
          message="The address does not end in a work order’s id; the link may have been cut short. Find the order in the list instead."
        />
      </div>
    );
  }
  if (workOrder.isPending) {
    return (
      <div className="space-y-4">
        {backLink}
        <LoadingNote what="the work order" />
      </div>
    );
  }
  if (workOrder.isError) {
    const notFound = isApiError(workOrder.error) && workOrder.error.status === 404;
    return (
      <div className="space-y-4">
        <title>Work order · Paraxia</title>
        {backLink}
        <ProblemNote
          title={notFound ? 'There is no work order at this address' : 'The work order could not be loaded'}
          message={workOrder.error.message}
          action={
            notFound ? null : (
              <Button variant="secondary" size="sm" onClick={() => workOrder.refetch()} isBusy={workOrder.isFetching}>
                Load again
              </Button>
            )
          }
        />
      </div>
    );
  }

  const order = workOrder.data;
  const refreshOrder = () => queryClient.invalidateQueries({ queryKey: workOrderQueryKey(order.id) });
  const closed = order.status === 'completed' || order.status === 'cancelled';
  return (
    <div className="space-y-8">
      <title>{`${order.number} · Paraxia`}</title>
      <div className="space-y-4">
        {backLink}
        <PageHeader
          kicker={
            <>
              Work order <span className="numerals text-ink-soft">{order.number}</span>
            </>
          }
          title={order.title}
          actions={
            canEdit && !isEditing ? (
              <Button variant="secondary" onClick={() => setIsEditing(true)}>
                Change status or due date
              </Button>
            ) : null
          }
        />
        {isEditing ? <WorkOrderProgressForm workOrder={order} onDone={() => setIsEditing(false)} /> : null}
        <WorkOrderFacts workOrder={order} todayIsoDate={todayIsoDate} />
      </div>

      <Section
        title="Lenses"
        description={
          order.lenses.length === 0
            ? 'The items the client sent for measurement.'
            : `${order.lenses.length} ${order.lenses.length === 1 ? 'lens' : 'lenses'}; open one for its full history.`
        }
        actions={
          canEdit && !isAddingLens && !closed ? (
            <Button variant="secondary" onClick={() => setIsAddingLens(true)}>
              Add lens
            </Button>
          ) : null
        }
      >
        <RegionErrorBoundary region="Lenses">
          {isAddingLens ? (
            <AddLensForm
              workOrderId={order.id}
              onCreated={async () => {
                await Promise.all([refreshOrder(), queryClient.invalidateQueries({ queryKey: workOrdersQueryKey })]);
              }}
              onCancel={() => setIsAddingLens(false)}
            />
          ) : null}
          <LensesTable
            lenses={order.lenses}
            canStartMeasurement={canMeasure && !closed}
            canOpenMeasurements={isLabStaff}
            emptyText={canEdit ? 'No lenses yet. Add the first with “Add lens”.' : 'No lenses have been entered on this work order yet.'}
          />
        </RegionErrorBoundary>
      </Section>
      {canMeasure && order.lenses.length > 0 && !closed ? <SafetyNote context="bench" /> : null}
    </div>
  );
}
