import { createBrowserRouter } from 'react-router';
import { AppLayout } from './layout';
import { RouteError } from '@client/components/errors/route-error';
import { paths } from '@client/config/paths';
import { RequireRole } from '@client/components/auth/require-role';

export const router = createBrowserRouter([
  {
    element: <AppLayout />,
    errorElement: <RouteError />,
    children: [
      { path: paths.home, lazy: async () => ({ Component: (await import('./routes/home')).default }), errorElement: <RouteError /> },
      { path: paths.signIn, lazy: async () => ({ Component: (await import('./routes/sign-in')).default }), errorElement: <RouteError /> },
      { path: paths.forgotPassword, lazy: async () => ({ Component: (await import('./routes/forgot-password')).default }), errorElement: <RouteError /> },
      { path: paths.resetPassword, lazy: async () => ({ Component: (await import('./routes/reset-password')).default }), errorElement: <RouteError /> },
      { path: paths.acceptInvitation, lazy: async () => ({ Component: (await import('./routes/accept-invitation')).default }), errorElement: <RouteError /> },
      {
        element: <RequireRole roles={['admin']} />,
        children: [
          { path: paths.members, lazy: async () => ({ Component: (await import('./routes/members')).default }), errorElement: <RouteError /> },
        ],
      },
      {
        // admins read their firm's mail; engineers the briefs they sent
        element: <RequireRole roles={['admin', 'engineer']} />,
        children: [{ path: paths.devMail, lazy: async () => ({ Component: (await import('./routes/dev-mail')).default }), errorElement: <RouteError /> }],
      },
      {
        element: <RequireRole />,
        children: [
          { path: paths.surveys, lazy: async () => ({ Component: (await import('./routes/surveys')).default }), errorElement: <RouteError /> },
          { path: paths.surveyPattern, lazy: async () => ({ Component: (await import('./routes/survey-workspace')).default }), errorElement: <RouteError /> },
        ],
      },
      {
        element: <RequireRole roles={['engineer', 'admin']} />,
        children: [
          { path: paths.review, lazy: async () => ({ Component: (await import('./routes/review-queue')).default }), errorElement: <RouteError /> },
          { path: paths.reviewSurveyPattern, lazy: async () => ({ Component: (await import('./routes/review-survey')).default }), errorElement: <RouteError /> },
        ],
      },
      { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found')).default }) },
    ],
  },
]);
