import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, redirect, type LoaderFunctionArgs } from 'react-router';
import { meQuery } from '../features/auth/api';
import { jobsQuery, pieceQuery, piecesQuery } from '../features/pieces/api';
import { usersQuery } from '../features/users/api';
import { Layout } from './routes/layout';
import { LoginPage } from './routes/login';
import { ForgotPasswordPage } from './routes/forgot-password';
import { ResetPasswordPage } from './routes/reset-password';
import { PiecesPage, listFilters } from './routes/pieces';
import { RouteError } from './routes/route-error';
import { YardPage } from './routes/yard';
import { YardPiecePage } from './routes/yard-piece';
import { yardPackQuery } from '../features/yard/pack';
import { reviewFilters } from './routes/review-filters';
import { designsQuery } from '../features/designs/api';
import { calibrationQuery, settingsQuery } from '../features/imports/settings-api';
import { importsQuery } from '../features/imports/api';
import { baysQuery } from '../features/shipping/api';
import { boardQuery, jobsStatusQuery, projectionQuery, reviewQuery } from '../features/review/api';

// Office pages are loaded when first opened, so the yard screens start with a small bundle.
const onlyOnPathChange = ({ currentUrl, nextUrl }: { currentUrl: URL; nextUrl: URL }): boolean => currentUrl.pathname !== nextUrl.pathname;

export function createRouter(qc: QueryClient) {
  const requireUser = async ({ request }: LoaderFunctionArgs) => {
    const me = await qc.ensureQueryData(meQuery);
    if (!me) {
      const next = new URL(request.url).pathname;
      throw redirect(`/login${next !== '/' ? `?next=${encodeURIComponent(next)}` : ''}`);
    }
    return me;
  };
  return createBrowserRouter([
    { path: '/login', element: <LoginPage /> },
    { path: '/forgot-password', element: <ForgotPasswordPage /> },
    { path: '/reset-password', element: <ResetPasswordPage /> },
    {
      path: '/',
      loader: requireUser,
      element: <Layout />,
      errorElement: <RouteError />,
      children: [
        {
          index: true,
          loader: async ({ request }) => {
            await Promise.all([qc.ensureQueryData(piecesQuery(listFilters(new URL(request.url).searchParams))), qc.ensureQueryData(jobsQuery)]);
            return null;
          },
          element: <PiecesPage />,
          // Filters change the URL; the page fetches them itself, so a filter change never waits on the loader.
          shouldRevalidate: onlyOnPathChange,
        },
        {
          path: 'pieces/:id',
          loader: async ({ params }) => Promise.all([qc.ensureQueryData(pieceQuery(params.id!)), qc.ensureQueryData(projectionQuery(params.id!))]),
          lazy: async () => ({ Component: (await import('./routes/piece')).PiecePage }),
          errorElement: <RouteError />,
        },
        { path: 'board', loader: async () => qc.ensureQueryData(boardQuery), lazy: async () => ({ Component: (await import('./routes/board')).BoardPage }), errorElement: <RouteError /> },
        {
          path: 'review',
          loader: async ({ request }) => Promise.all([qc.ensureQueryData(reviewQuery(reviewFilters(new URL(request.url).searchParams))), qc.ensureQueryData(jobsQuery)]),
          lazy: async () => ({ Component: (await import('./routes/review')).ReviewPage }),
          errorElement: <RouteError />,
          shouldRevalidate: onlyOnPathChange,
        },
        { path: 'bays', loader: async () => qc.ensureQueryData(baysQuery), lazy: async () => ({ Component: (await import('./routes/bays')).BaysPage }), errorElement: <RouteError /> },
        { path: 'imports', loader: async () => qc.ensureQueryData(importsQuery), lazy: async () => ({ Component: (await import('./routes/imports')).ImportsPage }), errorElement: <RouteError /> },
        { path: 'designs', loader: async () => Promise.all([qc.ensureQueryData(designsQuery), qc.ensureQueryData(jobsQuery)]), lazy: async () => ({ Component: (await import('./routes/designs')).DesignsPage }), errorElement: <RouteError /> },
        { path: 'designs/new', lazy: async () => ({ Component: (await import('./routes/designs')).DesignEditPage }), errorElement: <RouteError /> },
        { path: 'designs/:id/edit', lazy: async () => ({ Component: (await import('./routes/designs')).DesignEditPage }), errorElement: <RouteError /> },
        { path: 'settings', loader: async () => qc.ensureQueryData(settingsQuery), lazy: async () => ({ Component: (await import('./routes/settings')).SettingsPage }), errorElement: <RouteError /> },
        { path: 'calibration', loader: async () => qc.ensureQueryData(calibrationQuery), lazy: async () => ({ Component: (await import('./routes/calibration')).CalibrationPage }), errorElement: <RouteError /> },
        { path: 'shipping', lazy: async () => ({ Component: (await import('./routes/shipping')).ShippingPage }), errorElement: <RouteError /> },
        { path: 'admin/jobs', loader: async () => qc.ensureQueryData(jobsStatusQuery), lazy: async () => ({ Component: (await import('./routes/jobs-status')).JobsStatusPage }), errorElement: <RouteError /> },
        { path: 'yard', loader: async () => qc.ensureQueryData(yardPackQuery), element: <YardPage />, errorElement: <RouteError /> },
        { path: 'yard/pieces/:id', loader: async () => qc.ensureQueryData(yardPackQuery), element: <YardPiecePage />, errorElement: <RouteError /> },
        { path: 'tags', loader: async () => qc.ensureQueryData(jobsQuery), lazy: async () => ({ Component: (await import('./routes/tags')).TagsPage }), errorElement: <RouteError /> },
        {
          path: 'admin/users',
          loader: async () => Promise.all([qc.ensureQueryData(usersQuery), qc.ensureQueryData(jobsQuery)]),
          lazy: async () => ({ Component: (await import('./routes/users')).UsersPage }),
          errorElement: <RouteError />,
        },
      ],
    },
  ]);
}
