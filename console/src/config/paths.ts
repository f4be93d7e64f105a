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
  logbook: {
    path: 'logbook',
    getHref: (reservoirId: string) => `/reservoirs/${encodeURIComponent(reservoirId)}/logbook`,
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
  /** a downstream stakeholder's releases, outside any reservoir's screens */
  myReleases: {
    path: '/my-releases',
    getHref: () => '/my-releases',
  },
} as const;

export interface ScreenLink {
  id: string;
  label: string;
  getHref: (reservoirId: string) => string;
}

/** The screens of a reservoir, in navigation order; each later screen adds one line. */
export const RESERVOIR_SCREENS: readonly ScreenLink[] = [
  { id: 'overview', label: 'Overview', getHref: paths.overview.getHref },
  { id: 'alarms', label: 'Alarms', getHref: paths.alarms.getHref },
  { id: 'dam-safety', label: 'Dam safety', getHref: paths.damSafety.getHref },
  { id: 'alarm-rates', label: 'Alarm rates', getHref: paths.alarmRates.getHref },
  { id: 'orders', label: 'Gate orders', getHref: paths.orders.getHref },
  { id: 'logbook', label: 'Logbook', getHref: paths.logbook.getHref },
  { id: 'notices', label: 'Notices', getHref: paths.notices.getHref },
  { id: 'downstream', label: 'Downstream', getHref: paths.downstream.getHref },
  { id: 'outbox', label: 'Demo outbox', getHref: paths.outbox.getHref },
];
