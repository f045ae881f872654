import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { AppRoot } from '@/app/routes/app/root';
import { BenchRoute } from '@/app/routes/app/bench';
import { OrdersRoute } from '@/app/routes/app/orders';
import { OverviewRoute } from '@/app/routes/app/overview';
import { RequireRole } from '@/app/routes/app/require-role';
import { ReviewRoute } from '@/app/routes/app/review';
import { SystemRoute } from '@/app/routes/app/system';
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
