import type { QueryClient } from '@tanstack/react-query';
import { forecastUpdateSchema, type ForecastUpdate } from '@stillwell/shared/forecasts';
import { describeIssues, type SubscribeAck } from '@stillwell/shared/telemetry';
import type { LiveSocket } from '../../../lib/live-socket';
import { latestForecastQueryKey } from '../api/get-latest-forecast';

export interface ForecastSyncOptions {
  socket: LiveSocket;
  queryClient: QueryClient;
  reservoirId: string;
  onIssue?: (message: string | null) => void;
}

/**
 * Feeds the pushed forecast runs of one reservoir into the query cache. Joins the forecast room on
 * every connect and then refetches the latest run, since socket.io keeps nothing for a client
 * while it is away. A push never replaces a newer run with an older one.
 */
export function startForecastSync(options: ForecastSyncOptions): () => void {
  const { socket, queryClient, reservoirId, onIssue } = options;
  const key = latestForecastQueryKey(reservoirId);

  const subscribe = () => {
    socket.subscribeForecast({ reservoirId }, (ack: SubscribeAck | undefined) => {
      if (!ack?.ok) {
        onIssue?.(`Live forecasts were refused: ${ack?.error ?? 'no reason given'}`);
        return;
      }
      onIssue?.(null);
      void queryClient.invalidateQueries({ queryKey: key });
    });
  };

  const onForecast = (payload: unknown) => {
    const parsed = forecastUpdateSchema.safeParse(payload);
    if (!parsed.success) {
      onIssue?.(`An unreadable forecast was pushed: ${describeIssues(parsed.error)}`);
      return;
    }
    const next = parsed.data;
    if (next.reservoirId !== reservoirId) return;
    queryClient.setQueryData<ForecastUpdate>(key, (old) => {
      const oldAt = old?.run?.computedAtMs ?? -Infinity;
      const newAt = next.run?.computedAtMs ?? -Infinity;
      // a problem report keeps the run it came with; an older run never wins over a newer one
      return old && oldAt > newAt ? { ...old, problem: next.problem } : next;
    });
  };

  socket.on('connect', subscribe);
  socket.on('forecast', onForecast);
  if (socket.connected) subscribe();
  return () => {
    socket.off('connect', subscribe);
    socket.off('forecast', onForecast);
    if (socket.connected) socket.unsubscribeForecast({ reservoirId });
  };
}
