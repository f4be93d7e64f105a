/** Query keys of the alarms feature, spelled once. */
export const alarmKeys = {
  all: (reservoirId: string) => ['alarms', reservoirId] as const,
  list: (reservoirId: string) => ['alarms', reservoirId, 'list'] as const,
  histories: (reservoirId: string) => ['alarms', reservoirId, 'history'] as const,
  history: (reservoirId: string, conditionId: string) =>
    ['alarms', reservoirId, 'history', conditionId] as const,
  performance: (reservoirId: string, hours: number) =>
    ['alarms', reservoirId, 'performance', hours] as const,
};

/**
 * The alarm list comes pushed over the live socket (use-live-alarms); this slow refetch (wall ms)
 * is only the safety net for a push that was missed or a live connection that never came up.
 */
export const ALARM_REFETCH_MS = 30_000;
