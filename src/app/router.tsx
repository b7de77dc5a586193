import { createBrowserRouter } from 'react-router-dom';
import { queryClient } from '../lib/query-client';
import { requireUser } from './require-user';
import { RootLayout } from './routes/root-layout';
import { RouteError } from './routes/route-error';

export const router = createBrowserRouter([
  {
    path: '/',
    element: <RootLayout />,
    errorElement: <RouteError />,
    children: [
      {
        index: true,
        lazy: async () => {
          const m = await import('./routes/overview');
          return { Component: m.OverviewRoute, loader: m.overviewLoader(queryClient) };
        },
      },
      {
        path: 'sign-in',
        lazy: async () => ({ Component: (await import('./routes/sign-in')).SignInRoute }),
      },
      {
        path: 'bench',
        lazy: async () => {
          const m = await import('./routes/bench');
          return { Component: m.BenchRoute, loader: requireUser(queryClient) };
        },
      },
      {
        path: '*',
        lazy: async () => ({ Component: (await import('./routes/not-found')).NotFoundRoute }),
      },
    ],
  },
]);
