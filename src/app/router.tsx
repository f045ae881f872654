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
import { VerifyCertificateRoute } from '@/app/routes/verify-certificate';
import { AcceptInvitationRoute } from '@/app/routes/accept-invitation';
import { ChoosePasswordRoute } from '@/app/routes/choose-password';
import { AdminPeopleRoute } from '@/app/routes/app/admin-people';
import { AdminOrganisationsRoute } from '@/app/routes/app/admin-organisations';
import { AdminStorageRoute } from '@/app/routes/app/admin-storage';
import { AdminAuditRoute } from '@/app/routes/app/admin-audit';
import { AdminMailRoute } from '@/app/routes/app/admin-mail';
import { OrderRequestRoute } from '@/app/routes/app/order-request';

const router = createBrowserRouter([
  { path: '/sign-in', element: <SignInRoute />, errorElement: <RouteErrorPage /> },
  // Public pages: no sign-in.
  { path: '/verify', element: <VerifyCertificateRoute />, errorElement: <RouteErrorPage /> },
  { path: '/verify/:code', element: <VerifyCertificateRoute />, errorElement: <RouteErrorPage /> },
  { path: '/invitation/:token', element: <AcceptInvitationRoute />, errorElement: <RouteErrorPage /> },
  { path: '/password-reset/:token', element: <ChoosePasswordRoute />, errorElement: <RouteErrorPage /> },
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
        path: 'orders/request',
        element: (
          <RequireRole roles={['client']}>
            <OrderRequestRoute />
          </RequireRole>
        ),
      },
      {
        path: 'admin/people',
        element: (
          <RequireRole roles={['admin']}>
            <AdminPeopleRoute />
          </RequireRole>
        ),
      },
      {
        path: 'admin/organisations',
        element: (
          <RequireRole roles={['admin']}>
            <AdminOrganisationsRoute />
          </RequireRole>
        ),
      },
      {
        path: 'admin/storage',
        element: (
          <RequireRole roles={['admin']}>
            <AdminStorageRoute />
          </RequireRole>
        ),
      },
      {
        path: 'admin/audit',
        element: (
          <RequireRole roles={['admin']}>
            <AdminAuditRoute />
          </RequireRole>
        ),
      },
      {
        path: 'admin/mail',
        element: (
          <RequireRole roles={['admin']}>
            <AdminMailRoute />
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
