import { useState } from 'react';
import { createBrowserRouter, Navigate, RouterProvider, type RouteObject } from 'react-router-dom';
import { paths } from '../config/paths';
import { guardScreens } from '../features/auth/utils/guard-screens';
import { AlarmRatesRoute, AlarmsRoute } from './routes/alarms';
import { DamSafetyRoute } from './routes/dam-safety';
import { HomeRoute } from './routes/home';
import { LogbookHeadPrintRoute, LogbookRoute } from './routes/logbook';
import { NotFoundRoute } from './routes/not-found';
import { DownstreamRoute, MyReleasesRoute, NoticesRoute, OutboxRoute } from './routes/notices';
import { OrdersRoute } from './routes/orders';
import { OverviewRoute } from './routes/overview';
import { ProfileRoute } from './routes/profile';
import { ReplayRoute } from './routes/replay';
import { ReportsRoute } from './routes/reports';
import { ReservoirLayout } from './routes/reservoir-layout';
import { RouteError } from './routes/route-error';
import { WhatIfRoute } from './routes/what-if';
import { UsersRoute } from './routes/users';

export const routes: RouteObject[] = [
  { path: paths.home.path, element: <HomeRoute />, errorElement: <RouteError /> },
  { path: paths.myReleases.path, element: <MyReleasesRoute />, errorElement: <RouteError /> },
  { path: paths.profile.path, element: <ProfileRoute />, errorElement: <RouteError /> },
  { path: paths.users.path, element: <UsersRoute />, errorElement: <RouteError /> },
  {
    path: paths.logbookHeadPrint.path,
    element: <LogbookHeadPrintRoute />,
    errorElement: <RouteError />,
  },
  {
    path: paths.reservoir.path,
    element: <ReservoirLayout />,
    errorElement: <RouteError />,
    // each screen behind the guard its RESERVOIR_SCREENS entry names
    children: guardScreens([
      { index: true, element: <Navigate to={paths.overview.path} replace /> },
      { path: paths.overview.path, element: <OverviewRoute /> },
      { path: paths.alarms.path, element: <AlarmsRoute /> },
      { path: paths.alarmRates.path, element: <AlarmRatesRoute /> },
      { path: paths.damSafety.path, element: <DamSafetyRoute /> },
      { path: paths.orders.path, element: <OrdersRoute /> },
      { path: paths.whatIf.path, element: <WhatIfRoute /> },
      { path: paths.logbook.path, element: <LogbookRoute /> },
      { path: paths.replay.path, element: <ReplayRoute /> },
      { path: paths.reports.path, element: <ReportsRoute /> },
      { path: paths.notices.path, element: <NoticesRoute /> },
      { path: paths.downstream.path, element: <DownstreamRoute /> },
      { path: paths.outbox.path, element: <OutboxRoute /> },
    ]),
  },
  { path: '*', element: <NotFoundRoute /> },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
