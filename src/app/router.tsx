import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { AppLayout } from './layout.tsx';
import { RouteError } from './route-error.tsx';
import { NotFoundRoute } from './routes/not-found.tsx';

// Route-level code splitting: each screen is its own chunk, loaded on first visit.
const page = (load: () => Promise<{ default: React.ComponentType }>) => async () => ({ Component: (await load()).default });

export const routes: RouteObject[] = [
  {
    element: <AppLayout />,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: page(() => import('./routes/home.tsx')) },
      { path: 'welcome', lazy: page(() => import('./routes/welcome.tsx')) },
      { path: 'account', lazy: page(() => import('./routes/account.tsx')) },
      { path: 'invitations/:token', lazy: page(() => import('./routes/invitation.tsx')) },
      {
        path: 'o/:orgId',
        lazy: page(() => import('./routes/org-layout.tsx')),
        errorElement: <RouteError />,
        children: [
          { index: true, lazy: page(() => import('./routes/overview.tsx')) },
          { path: 'sites', lazy: page(() => import('./routes/sites.tsx')) },
          { path: 'sites/new', lazy: async () => ({ Component: (await import('./routes/site-edit.tsx')).SiteNewRoute }) },
          { path: 'sites/:siteId/edit', lazy: page(() => import('./routes/site-edit.tsx')) },
          { path: 'sites/:siteId/tides', lazy: page(() => import('./routes/site-tides.tsx')) },
          { path: 'sites/:siteId/forecast', lazy: page(() => import('./routes/site-forecast.tsx')) },
          { path: 'plan', lazy: page(() => import('./routes/plan.tsx')) },
          { path: 'alerts', lazy: page(() => import('./routes/alerts.tsx')) },
          { path: 'profiles', lazy: page(() => import('./routes/profiles.tsx')) },
          { path: 'profiles/:profileId', lazy: page(() => import('./routes/profile-detail.tsx')) },
          { path: 'lab', lazy: page(() => import('./routes/lab.tsx')) },
          { path: 'team', lazy: page(() => import('./routes/team.tsx')) },
          { path: 'billing', lazy: page(() => import('./routes/billing.tsx')) },
          { path: 'audit', lazy: page(() => import('./routes/audit.tsx')) },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);
