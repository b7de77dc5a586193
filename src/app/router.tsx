import { createBrowserRouter, type LoaderFunctionArgs } from 'react-router-dom';
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
          // Signed out, the app opens on the sign-in form: the overview lists the lab's sessions.
          const overview = m.overviewLoader(queryClient);
          return { Component: m.OverviewRoute, loader: async (args: LoaderFunctionArgs) => (await requireUser(queryClient)(args)) && overview() };
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
        path: 'sessions',
        lazy: async () => ({ Component: (await import('./routes/sessions')).SessionsRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'sessions/:id',
        lazy: async () => ({ Component: (await import('./routes/session')).SessionRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'sessions/:id/report',
        lazy: async () => ({ Component: (await import('./routes/session-report')).SessionReportRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'conditions',
        lazy: async () => ({ Component: (await import('./routes/condition-grid')).ConditionGridRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'compare',
        lazy: async () => ({ Component: (await import('./routes/compare')).CompareRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'builds',
        lazy: async () => ({ Component: (await import('./routes/builds')).BuildsRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'builds/:id',
        lazy: async () => ({ Component: (await import('./routes/build')).BuildRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'cores',
        lazy: async () => ({ Component: (await import('./routes/cores')).CoresRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'cores/:id',
        lazy: async () => ({ Component: (await import('./routes/core')).CoreRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'boards',
        lazy: async () => ({ Component: (await import('./routes/boards')).BoardsRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'boards/:id',
        lazy: async () => ({ Component: (await import('./routes/board')).BoardRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'account',
        lazy: async () => ({ Component: (await import('./routes/account')).AccountRoute, loader: requireUser(queryClient) }),
      },
      {
        path: 'invite/:token',
        lazy: async () => ({ Component: (await import('./routes/accept-invitation')).AcceptInvitationRoute }),
      },
      {
        path: 'team',
        lazy: async () => ({ Component: (await import('./routes/team')).TeamRoute, loader: requireUser(queryClient) }),
      },
      {
        path: '*',
        lazy: async () => ({ Component: (await import('./routes/not-found')).NotFoundRoute }),
      },
    ],
  },
]);
