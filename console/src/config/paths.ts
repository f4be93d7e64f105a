import type { Action } from '@stillwell/shared/access';

/** Route paths and the links that point at them, spelled once. */
export const paths = {
  home: {
    path: '/',
    getHref: () => '/',
  },
  reservoir: {
    path: '/reservoirs/:reservoirId',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}`,
  },
  overview: {
    path: 'overview',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/overview`,
  },
  alarms: {
    path: 'alarms',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/alarms`,
  },
  alarmRates: {
    path: 'alarm-rates',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/alarm-rates`,
  },
  damSafety: {
    path: 'dam-safety',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/dam-safety`,
  },
  orders: {
    path: 'orders',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/orders`,
  },
  whatIf: {
    path: 'what-if',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/what-if`,
  },
  logbook: {
    path: 'logbook',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/logbook`,
  },
  /** the logbook head on a sheet of its own, outside the console's frame, to print and keep */
  logbookHeadPrint: {
    path: '/reservoirs/:reservoirId/logbook/head',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/logbook/head`,
  },
  notices: {
    path: 'notices',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/notices`,
  },
  downstream: {
    path: 'downstream',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/downstream`,
  },
  outbox: {
    path: 'outbox',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/outbox`,
  },
  replay: {
    path: 'replay',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/replay`,
  },
  reports: {
    path: 'reports',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/reports`,
  },
  /** a downstream stakeholder's releases, outside any reservoir's screens */
  myReleases: {
    path: '/my-releases',
    getHref: () => '/my-releases',
  },
  /** one's own account: password, second factor, sessions */
  profile: {
    path: '/profile',
    getHref: () => '/profile',
  },
  /** the administrator's accounts page */
  users: {
    path: '/users',
    getHref: () => '/users',
  },
} as const;

export interface ScreenLink {
  id: string;
  label: string;
  getHref: (reservoirId: string) => string;
  /** what the screen shows needs this; the shell hides the link and refuses the screen without it */
  action?: Action;
}

/** The screens of a reservoir, in navigation order; each later screen adds one line. */
export const RESERVOIR_SCREENS: readonly ScreenLink[] = [
  { id: 'overview', label: 'Overview', getHref: paths.overview.getHref, action: 'telemetry.read' },
  { id: 'alarms', label: 'Alarms', getHref: paths.alarms.getHref, action: 'alarms.read' },
  {
    id: 'dam-safety',
    label: 'Dam safety',
    getHref: paths.damSafety.getHref,
    action: 'telemetry.read',
  },
  {
    id: 'alarm-rates',
    label: 'Alarm rates',
    getHref: paths.alarmRates.getHref,
    action: 'alarms.read',
  },
  { id: 'orders', label: 'Gate orders', getHref: paths.orders.getHref, action: 'orders.read' },
  { id: 'what-if', label: 'What-if', getHref: paths.whatIf.getHref, action: 'forecast.read' },
  { id: 'logbook', label: 'Logbook', getHref: paths.logbook.getHref, action: 'logbook.read' },
  { id: 'replay', label: 'Replay', getHref: paths.replay.getHref, action: 'replay.read' },
  { id: 'reports', label: 'Reports', getHref: paths.reports.getHref, action: 'reports.create' },
  { id: 'notices', label: 'Notices', getHref: paths.notices.getHref, action: 'notices.read' },
  {
    id: 'downstream',
    label: 'Downstream',
    getHref: paths.downstream.getHref,
    action: 'notices.manage',
  },
  { id: 'outbox', label: 'Demo outbox', getHref: paths.outbox.getHref, action: 'notices.send' },
];
