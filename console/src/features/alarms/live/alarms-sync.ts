import type { QueryClient } from '@tanstack/react-query';
import { alarmListSchema, type AlarmList } from '@stillwell/shared/alarms';
import { describeIssues, type SubscribeAck } from '@stillwell/shared/telemetry';
import type { LiveSocket } from '../../../lib/live-socket';
import { alarmKeys } from '../api/keys';

export interface AlarmsSyncOptions {
  socket: LiveSocket;
  queryClient: QueryClient;
  reservoirId: string;
  onIssue?: (message: string | null) => void;
}

/**
 * Writes each alarm list the gateway pushes into the cache the list and the banner read. Joins the
 * alarms room on every connect: the gateway answers a subscription with the whole list, which also
 * covers whatever changed while the connection was down.
 */
export function startAlarmsSync(options: AlarmsSyncOptions): () => void {
  const { socket, queryClient, reservoirId, onIssue } = options;

  const subscribe = () => {
    socket.subscribeAlarms({ reservoirId }, (ack: SubscribeAck | undefined) => {
      onIssue?.(ack?.ok ? null : `Live alarms were refused: ${ack?.error ?? 'no reason given'}`);
    });
  };

  const onList = (payload: unknown) => {
    const parsed = alarmListSchema.safeParse(payload);
    if (!parsed.success)
      return onIssue?.(`An unreadable alarm list was pushed: ${describeIssues(parsed.error)}`);
    if (parsed.data.reservoirId !== reservoirId) return;
    queryClient.setQueryData<AlarmList>(alarmKeys.list(reservoirId), parsed.data);
    // histories are not pushed: an open one is fetched again when its list changes
    void queryClient.invalidateQueries({ queryKey: alarmKeys.histories(reservoirId) });
  };

  socket.on('connect', subscribe);
  socket.on('alarm-list', onList);
  if (socket.connected) subscribe();
  return () => {
    socket.off('connect', subscribe);
    socket.off('alarm-list', onList);
    if (socket.connected) socket.unsubscribeAlarms({ reservoirId });
  };
}
