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
} as const;

export interface ScreenLink {
  id: string;
  label: string;
  getHref: (reservoirId: string) => string;
}

/** The screens of a reservoir, in navigation order; each later screen adds one line. */
export const RESERVOIR_SCREENS: readonly ScreenLink[] = [
  { id: 'overview', label: 'Overview', getHref: paths.overview.getHref },
];
