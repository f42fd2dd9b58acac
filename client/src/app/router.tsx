import { createBrowserRouter } from 'react-router';
import { AppLayout } from './layout';
import { RouteError } from '@client/components/errors/route-error';
import { paths } from '@client/config/paths';

export const router = createBrowserRouter([
  {
    element: <AppLayout />,
    errorElement: <RouteError />,
    children: [
      { path: paths.home, lazy: async () => ({ Component: (await import('./routes/home')).default }), errorElement: <RouteError /> },
      { path: paths.signIn, lazy: async () => ({ Component: (await import('./routes/sign-in')).default }), errorElement: <RouteError /> },
      { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found')).default }) },
    ],
  },
]);
