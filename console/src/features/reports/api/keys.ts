/** Query keys of event reports, under the reservoir's. */
export const reportKeys = {
  all: (reservoirId: string) => ['reservoirs', reservoirId, 'reports'] as const,
  demoWindow: (reservoirId: string) => [...reportKeys.all(reservoirId), 'demo-window'] as const,
  job: (reservoirId: string, id: string) => [...reportKeys.all(reservoirId), 'job', id] as const,
  result: (reservoirId: string, id: string) =>
    [...reportKeys.all(reservoirId), 'result', id] as const,
};

export const reportsPath = (reservoirId: string, rest = '') =>
  `/api/reservoirs/${encodeURIComponent(reservoirId)}/reports${rest ? `/${rest}` : ''}`;
