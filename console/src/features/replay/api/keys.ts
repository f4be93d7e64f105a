/** Query keys of the replay, under the reservoir's. */
export const replayKeys = {
  all: (reservoirId: string) => ['reservoirs', reservoirId, 'replay'] as const,
  events: (reservoirId: string) => [...replayKeys.all(reservoirId), 'events'] as const,
  window: (reservoirId: string, fromMs: number, toMs: number) =>
    [...replayKeys.all(reservoirId), 'window', fromMs, toMs] as const,
  entries: (reservoirId: string, fromMs: number, toMs: number) =>
    [...replayKeys.all(reservoirId), 'entries', fromMs, toMs] as const,
  forecast: (reservoirId: string, runId: number) =>
    [...replayKeys.all(reservoirId), 'forecast', runId] as const,
};

export const replayPath = (reservoirId: string, rest: string) =>
  `/api/reservoirs/${encodeURIComponent(reservoirId)}/replay/${rest}`;

export const isoOf = (ms: number) => new Date(ms).toISOString();
