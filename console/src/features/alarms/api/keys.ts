/** Query keys of the alarms feature, spelled once. */
export const alarmKeys = {
  all: (reservoirId: string) => ['alarms', reservoirId] as const,
  list: (reservoirId: string) => ['alarms', reservoirId, 'list'] as const,
  history: (reservoirId: string, conditionId: string) =>
    ['alarms', reservoirId, 'history', conditionId] as const,
  performance: (reservoirId: string, hours: number) =>
    ['alarms', reservoirId, 'performance', hours] as const,
};

/**
 * The alarm list is asked for again this often (wall ms). The gateway pushes no alarm events over
 * the live socket yet; two seconds keeps a new alarm on screen within moments of being raised.
 */
export const ALARM_POLL_MS = 2000;
