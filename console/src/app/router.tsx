import { useState } from 'react';
import { createBrowserRouter, Navigate, RouterProvider, type RouteObject } from 'react-router-dom';
import { paths } from '../config/paths';
import { HomeRoute } from './routes/home';
import { NotFoundRoute } from './routes/not-found';
import { OverviewRoute } from './routes/overview';
import { ReservoirLayout } from './routes/reservoir-layout';
import { RouteError } from './routes/route-error';

export const routes: RouteObject[] = [
  { path: paths.home.path, element: <HomeRoute />, errorElement: <RouteError /> },
  {
    path: paths.reservoir.path,
    element: <ReservoirLayout />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Navigate to={paths.overview.path} replace /> },
      { path: paths.overview.path, element: <OverviewRoute /> },
    ],
  },
  { path: '*', element: <NotFoundRoute /> },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
