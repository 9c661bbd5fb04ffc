import { createBrowserRouter } from 'react-router-dom';
import { AppLayout } from './layout.tsx';
import { RouteError } from './route-error.tsx';
import { NotFoundRoute } from './routes/not-found.tsx';
import { OverviewRoute } from './routes/overview.tsx';

export const routes = [
  {
    element: <AppLayout />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <OverviewRoute />, errorElement: <RouteError /> },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);
