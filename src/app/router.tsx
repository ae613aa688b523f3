// Every page, lazily loaded; the shell and sign-in guard wrap the signed-in ones.
import { createBrowserRouter } from 'react-router-dom';
import { AppShell } from './app-shell';
import { RequireAuth } from './require-auth';
import { RouteError } from './routes/route-error';

const lazy = (load: () => Promise<{ default: React.ComponentType }>) => async () => ({ Component: (await load()).default });

export const router = createBrowserRouter([
  { path: '/sign-in', lazy: lazy(() => import('./routes/sign-in')), errorElement: <RouteError /> },
  { path: '/invite/:token', lazy: lazy(() => import('./routes/invite')), errorElement: <RouteError /> },
  {
    element: <RequireAuth />,
    errorElement: <RouteError />,
    children: [
      {
        element: <AppShell />,
        errorElement: <RouteError />,
        children: [
          { path: '/', lazy: lazy(() => import('./routes/home')) },
          { path: '/projects/new', lazy: lazy(() => import('./routes/project-new')) },
          { path: '/projects/:projectId', lazy: lazy(() => import('./routes/project-builds')) },
          { path: '/projects/:projectId/builds/new', lazy: lazy(() => import('./routes/build-new')) },
          { path: '/projects/:projectId/builds/:buildId', lazy: lazy(() => import('./routes/build')) },
          { path: '/projects/:projectId/builds/:buildId/edit', lazy: lazy(() => import('./routes/build-edit')) },
          { path: '/projects/:projectId/upload', lazy: lazy(() => import('./routes/upload')) },
          { path: '/projects/:projectId/compare', lazy: lazy(() => import('./routes/compare')) },
          { path: '/projects/:projectId/gains', lazy: lazy(() => import('./routes/gains')) },
          { path: '/projects/:projectId/review-pack', lazy: lazy(() => import('./routes/review-pack')) },
          { path: '/projects/:projectId/durability', lazy: lazy(() => import('./routes/durability')) },
          { path: '/projects/:projectId/series', lazy: lazy(() => import('./routes/series')) },
          { path: '/projects/:projectId/lineage', lazy: lazy(() => import('./routes/lineage')) },
          { path: '/projects/:projectId/surface', lazy: lazy(() => import('./routes/surface')) },
          { path: '/projects/:projectId/plan', lazy: lazy(() => import('./routes/plan')) },
          { path: '/projects/:projectId/targets', lazy: lazy(() => import('./routes/targets')) },
          { path: '/projects/:projectId/benchmark', lazy: lazy(() => import('./routes/benchmark')) },
          { path: '/projects/:projectId/lots', lazy: lazy(() => import('./routes/project-lots')) },
          { path: '/lots/:lotId', lazy: lazy(() => import('./routes/lot')) },
          { path: '/projects/:projectId/settings', lazy: lazy(() => import('./routes/settings')) },
          { path: '/account', lazy: lazy(() => import('./routes/account')) },
          { path: '/admin/people', lazy: lazy(() => import('./routes/admin-people')) },
          { path: '/admin/labs', lazy: lazy(() => import('./routes/admin-labs')) },
          { path: '/admin/outbox', lazy: lazy(() => import('./routes/admin-outbox')) },
          { path: '/admin/audit', lazy: lazy(() => import('./routes/admin-audit')) },
          { path: '/admin/backups', lazy: lazy(() => import('./routes/admin-backups')) },
          { path: '*', lazy: lazy(() => import('./routes/not-found')) },
        ],
      },
    ],
  },
]);
