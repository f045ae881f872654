import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { AppRoot } from '@/app/routes/app/root';
import { BenchRoute } from '@/app/routes/app/bench';
import { OrdersRoute } from '@/app/routes/app/orders';
import { OverviewRoute } from '@/app/routes/app/overview';
import { RequireRole } from '@/app/routes/app/require-role';
import { ReviewRoute } from '@/app/routes/app/review';
import { SystemRoute } from '@/app/routes/app/system';
import { EquipmentRoute } from '@/app/routes/app/equipment';
import { LensDetailRoute } from '@/app/routes/app/lens-detail';
import { WorkOrderDetailRoute } from '@/app/routes/app/work-order-detail';
import { WorkOrdersRoute } from '@/app/routes/app/work-orders';
import { MeasurementRoute } from '@/app/routes/app/measurement';
import { NewMeasurementRoute } from '@/app/routes/app/measurement-new';
import { NotFoundRoute } from '@/app/routes/not-found';
import { RouteErrorPage } from '@/app/routes/route-error';
import { SignInRoute } from '@/app/routes/sign-in';

const router = createBrowserRouter([
  { path: '/sign-in', element: <SignInRoute />, errorElement: <RouteErrorPage /> },
  {
    path: '/',
    element: <AppRoot />,
    errorElement: <RouteErrorPage />,
    children: [
      { index: true, element: <OverviewRoute /> },
      {
        path: 'work-orders',
        element: (
          <RequireRole roles={['technician', 'reviewer', 'admin', 'client']}>
            <WorkOrdersRoute />
          </RequireRole>
        ),
      },
      {
        path: 'work-orders/:workOrderId',
        element: (
          <RequireRole roles={['technician', 'reviewer', 'admin', 'client']}>
            <WorkOrderDetailRoute />
          </RequireRole>
        ),
      },
      {
        path: 'lenses/:lensId',
        element: (
          <RequireRole roles={['technician', 'reviewer', 'admin', 'client']}>
            <LensDetailRoute />
          </RequireRole>
        ),
      },
      {
        path: 'equipment',
        element: (
          <RequireRole roles={['technician', 'reviewer', 'admin']}>
            <EquipmentRoute />
          </RequireRole>
        ),
      },
      {
        path: 'measurements/new',
        element: (
          <RequireRole roles={['technician']}>
            <NewMeasurementRoute />
          </RequireRole>
        ),
      },
      {
        path: 'measurements/:measurementId',
        element: (
          <RequireRole roles={['technician', 'reviewer', 'admin']}>
            <MeasurementRoute />
          </RequireRole>
        ),
      },
      {
        path: 'bench',
        element: (
          <RequireRole roles={['technician']}>
            <BenchRoute />
          </RequireRole>
        ),
      },
      {
        path: 'review',
        element: (
          <RequireRole roles={['reviewer']}>
            <ReviewRoute />
          </RequireRole>
        ),
      },
      {
        path: 'orders',
        element: (
          <RequireRole roles={['client']}>
            <OrdersRoute />
          </RequireRole>
        ),
      },
      {
        path: 'system',
        element: (
          <RequireRole roles={['admin']}>
            <SystemRoute />
          </RequireRole>
        ),
      },
    ],
  },
  { path: '*', element: <NotFoundRoute /> },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
