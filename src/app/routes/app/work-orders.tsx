import { useEffect, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { ConvergingLensIllustration } from '@/components/illustrations/converging-lens';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { LoadingNote } from '@/components/ui/loading-note';
import { PageHeader } from '@/components/ui/page-header';
import { ProblemNote } from '@/components/ui/problem-note';
import { hasAnyRole } from '@/lib/authorization';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { useClientOrganisations } from '@/features/work-orders/api/get-client-organisations';
import { useWorkOrders } from '@/features/work-orders/api/get-work-orders';
import { ListPagination } from '@/features/work-orders/components/list-pagination';
import { NewWorkOrderForm } from '@/features/work-orders/components/new-work-order-form';
import { WorkOrderFilters } from '@/features/work-orders/components/work-order-filters';
import { WorkOrdersTable } from '@/features/work-orders/components/work-orders-table';
import { useTodayIsoDate } from '@/features/work-orders/hooks/use-today';
import { useWorkOrderListState } from '@/features/work-orders/hooks/use-work-order-list-state';
import { hasActiveFilters, listRange } from '@/features/work-orders/lib/work-order-list-state';

export function WorkOrdersRoute() {
  const { data: user } = useCurrentUser();
  const navigate = useNavigate();
  const todayIsoDate = useTodayIsoDate();
  const [state, change] = useWorkOrderListState();
  const [isCreating, setIsCreating] = useState(false);
  const isLabStaff = user ? hasAnyRole(user, ['technician', 'reviewer', 'admin']) : false;
  const canCreate = user ? hasAnyRole(user, ['technician', 'admin']) : false;
  const organisations = useClientOrganisations({ enabled: isLabStaff });
  const workOrders = useWorkOrders(state);

  const total = workOrders.data?.total ?? 0;
  const pageCount = listRange({ page: state.page, pageSize: state.pageSize, total }).pageCount;
  // An old link may point past the last page once orders are closed or filtered away.
  useEffect(() => {
    if (workOrders.data && !workOrders.isPlaceholderData && state.page > pageCount) change({ kind: 'page', page: pageCount }, { replace: true });
  }, [workOrders.data, workOrders.isPlaceholderData, state.page, pageCount, change]);

  const isClientOnly = user ? !isLabStaff && hasAnyRole(user, ['client']) : false;
  return (
    <div className="space-y-6">
      <title>Work orders · Paraxia</title>
      <PageHeader
        kicker={isClientOnly ? (user?.organisation?.name ?? 'Your orders') : 'Orders'}
        title="Work orders"
        actions={
          canCreate && !isCreating ? (
            <Button onClick={() => setIsCreating(true)}>New work order</Button>
          ) : null
        }
      >
        {isClientOnly
          ? 'The work your organisation has sent to the lab, and where each order stands.'
          : 'Every client’s request, from arrival to the last certificate. Search by number, title, client, reference or lens.'}
      </PageHeader>

      {isCreating ? (
        <RegionErrorBoundary region="New work order">
          <NewWorkOrderForm
            todayIsoDate={todayIsoDate}
            onCreated={(workOrder) => navigate(`/work-orders/${workOrder.id}`)}
            onCancel={() => setIsCreating(false)}
          />
        </RegionErrorBoundary>
      ) : null}

      <RegionErrorBoundary region="Work orders">
        <div className="space-y-3">
          <WorkOrderFilters state={state} onChange={change} organisations={isLabStaff ? (organisations.data ?? []) : null} />
          {workOrders.isPending ? (
            <LoadingNote what="work orders" />
          ) : workOrders.isError ? (
            <ProblemNote
              title="The work orders could not be loaded"
              message={workOrders.error.message}
              action={
                <Button variant="secondary" size="sm" onClick={() => workOrders.refetch()} isBusy={workOrders.isFetching}>
                  Load again
                </Button>
              }
            />
          ) : workOrders.data.total === 0 && !hasActiveFilters(state) ? (
            <EmptyState
              illustration={<ConvergingLensIllustration />}
              title="No work orders yet"
              willShow={[
                'Each client request with its number, due date and status',
                'How many lenses it holds and how many have been measured',
                'Late orders marked at a glance',
              ]}
            >
              <p>
                {canCreate
                  ? 'Open the first one with “New work order” when a client’s lenses arrive; you can add the lenses to it next.'
                  : 'When the lab opens a work order, it is listed here.'}
              </p>
            </EmptyState>
          ) : (
            <div className={`space-y-3 transition-opacity ${workOrders.isPlaceholderData ? 'opacity-60' : ''}`} aria-busy={workOrders.isFetching}>
              <WorkOrdersTable
                items={workOrders.data.items}
                state={state}
                onSort={(field) => change({ kind: 'sort', field })}
                todayIsoDate={todayIsoDate}
                emptyText="No work order matches this search and these filters. Loosen them, or clear them to see every order."
                showClient={!isClientOnly}
              />
              {workOrders.data.total > 0 ? (
                <ListPagination
                  page={state.page}
                  pageSize={state.pageSize}
                  total={workOrders.data.total}
                  onPage={(page) => change({ kind: 'page', page })}
                  onPageSize={(pageSize) => change({ kind: 'page-size', pageSize })}
                />
              ) : null}
            </div>
          )}
        </div>
      </RegionErrorBoundary>
    </div>
  );
}
