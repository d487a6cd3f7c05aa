import { createBrowserRouter, Navigate, redirect } from 'react-router';
import type { LoaderFunctionArgs } from 'react-router';
import { queryClient } from '../lib/query-client';
import { meQueryOptions } from '../features/auth/api/me';
import { SignInRoute } from '../features/auth/routes/sign-in';
import { SignUpRoute } from '../features/auth/routes/sign-up';
import { ForgotPasswordRoute } from '../features/auth/routes/forgot-password';
import { ResetPasswordRoute } from '../features/auth/routes/reset-password';
import { AcceptInviteRoute } from '../features/team/routes/accept-invite';
import { TeamRoute } from '../features/team/routes/team';
import { LibraryRoute } from '../features/library/routes/library';
import { ArtDetailRoute } from '../features/library/routes/art-detail';
import { SheetsRoute } from '../features/sheets/routes/sheets';
import { PrintRoomRoute } from '../features/shop/routes/print-room';
import { OrdersRoute } from '../features/orders/routes/orders';
import { OrderRoute } from '../features/orders/routes/order';
import { AccountRoute } from '../features/account/routes/account';
import { OutboxRoute } from '../features/dev/routes/outbox';
import { AppShell } from './app-shell';
import { RouteError } from './route-error';
import { homePath } from './paths';

async function requireSignedIn({ request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (!me) {
    const url = new URL(request.url);
    throw redirect(`/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`);
  }
  return null;
}

async function requireSignedOut() {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (me) throw redirect(homePath(me));
  return null;
}

async function home() {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  throw redirect(me ? homePath(me) : '/sign-in');
}

export const router = createBrowserRouter([
  {
    errorElement: <RouteError />,
    children: [
      { path: '/', loader: home },
      { path: '/sign-in', loader: requireSignedOut, element: <SignInRoute /> },
      { path: '/sign-up', loader: requireSignedOut, element: <SignUpRoute /> },
      { path: '/forgot-password', element: <ForgotPasswordRoute /> },
      { path: '/reset-password/:token', element: <ResetPasswordRoute /> },
      { path: '/invite/:token', element: <AcceptInviteRoute /> },
      { path: '/dev/outbox', element: <OutboxRoute /> },
      {
        loader: requireSignedIn,
        element: <AppShell />,
        children: [
          { path: '/account', element: <AccountRoute /> },
          { path: '/t/:teamId', element: <Navigate to="library" replace /> },
          { path: '/t/:teamId/library', element: <LibraryRoute /> },
          { path: '/t/:teamId/library/:artId', element: <ArtDetailRoute /> },
          { path: '/t/:teamId/sheets', element: <SheetsRoute /> },
          // The editor brings the canvas library: its own chunk, fetched when a sheet is first opened.
          {
            path: '/t/:teamId/sheets/:sheetId',
            lazy: () => import('../features/editor/routes/editor').then((m) => ({ Component: m.EditorRoute })),
          },
          { path: '/t/:teamId/print-room', element: <PrintRoomRoute /> },
          { path: '/t/:teamId/orders', element: <OrdersRoute /> },
          { path: '/t/:teamId/orders/:orderId', element: <OrderRoute /> },
          { path: '/t/:teamId/team', element: <TeamRoute /> },
        ],
      },
      { path: '*', element: <RouteError notFound /> },
    ],
  },
]);
