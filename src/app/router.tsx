import { lazy, Suspense, type ReactNode } from 'react';
import { createBrowserRouter } from 'react-router';
import { RouteErrorBoundary, ErrorView } from '@/components/errors/error-view';
import { Loading } from '@/components/ui/card';
import { RequireAuth, RequireRole, NotAllowed } from './routes/auth/require-auth';
import { paths } from '@/config/paths';

const SignIn = lazy(() => import('./routes/auth/sign-in'));
const SetPassword = lazy(() => import('./routes/auth/set-password'));
const ResetPassword = lazy(() => import('./routes/auth/reset-password'));
const Home = lazy(() => import('./routes/home/home'));
const People = lazy(() => import('./routes/admin/people'));
const Outbox = lazy(() => import('./routes/admin/outbox'));

const page = (node: ReactNode) => <Suspense fallback={<Loading />}>{node}</Suspense>;

export const router = createBrowserRouter([
  { path: paths.signIn, element: page(<SignIn />), errorElement: <RouteErrorBoundary /> },
  { path: paths.setPassword(), element: page(<SetPassword />), errorElement: <RouteErrorBoundary /> },
  { path: paths.resetPassword, element: page(<ResetPassword />), errorElement: <RouteErrorBoundary /> },
  {
    element: <RequireAuth />,
    errorElement: <RouteErrorBoundary />,
    children: [
      { index: true, element: page(<Home />), errorElement: <RouteErrorBoundary /> },
      { path: paths.notAllowed, element: <NotAllowed /> },
      {
        element: <RequireRole roles={['admin']} />,
        children: [
          { path: paths.people, element: page(<People />), errorElement: <RouteErrorBoundary /> },
          { path: paths.outbox, element: page(<Outbox />), errorElement: <RouteErrorBoundary /> },
        ],
      },
      { path: '*', element: <ErrorView title="Page not found" message="There is nothing at this address." /> },
    ],
  },
]);
