import type { QueryClient } from '@tanstack/react-query';
import {
  emergencySchema,
  orderAlarmSchema,
  orderSchema,
  type CurrentEmergency,
  type OrderAlarm,
} from '@stillwell/shared/orders';
import { describeIssues, type SubscribeAck } from '@stillwell/shared/telemetry';
import type { LiveSocket } from '../../../lib/live-socket';
import { ordersKeys } from '../api/keys';
import { rememberOrder } from '../api/order-actions';

export interface OrdersSyncOptions {
  socket: LiveSocket;
  queryClient: QueryClient;
  reservoirId: string;
  onIssue?: (message: string | null) => void;
}

const MAX_ALARMS = 50;

/**
 * Feeds one reservoir's pushed orders, emergency state, rule changes and order alarms into the
 * query cache. Joins the orders room on every connect and then refetches, because socket.io keeps
 * nothing for a client while it is away.
 */
export function startOrdersSync(options: OrdersSyncOptions): () => void {
  const { socket, queryClient, reservoirId, onIssue } = options;

  const subscribe = () => {
    socket.subscribeOrders({ reservoirId }, (ack: SubscribeAck | undefined) => {
      if (!ack?.ok) {
        onIssue?.(`Live orders were refused: ${ack?.error ?? 'no reason given'}`);
        return;
      }
      onIssue?.(null);
      void queryClient.invalidateQueries({ queryKey: ordersKeys.all(reservoirId) });
      void queryClient.invalidateQueries({ queryKey: ['orders', 'detail'] });
    });
  };

  const onOrder = (payload: unknown) => {
    const parsed = orderSchema.safeParse(payload);
    if (!parsed.success)
      return onIssue?.(`An unreadable order was pushed: ${describeIssues(parsed.error)}`);
    if (parsed.data.reservoirId !== reservoirId) return;
    rememberOrder(queryClient, parsed.data);
    void queryClient.invalidateQueries({ queryKey: ordersKeys.interlocks(parsed.data.id) });
  };

  const onEmergency = (payload: unknown) => {
    const parsed = emergencySchema.nullable().safeParse(payload);
    if (!parsed.success)
      return onIssue?.(`An unreadable emergency state was pushed: ${describeIssues(parsed.error)}`);
    if (parsed.data && parsed.data.reservoirId !== reservoirId) return;
    queryClient.setQueryData<CurrentEmergency>(ordersKeys.emergency(reservoirId), {
      emergency: parsed.data,
    });
  };

  const onAutomation = () => {
    void queryClient.invalidateQueries({ queryKey: ordersKeys.automation(reservoirId) });
  };

  const onAlarm = (payload: unknown) => {
    const parsed = orderAlarmSchema.safeParse(payload);
    if (!parsed.success || parsed.data.reservoirId !== reservoirId) return;
    queryClient.setQueryData<OrderAlarm[]>(ordersKeys.alarms(reservoirId), (old = []) =>
      [parsed.data, ...old].slice(0, MAX_ALARMS),
    );
  };

  socket.on('connect', subscribe);
  socket.on('order', onOrder);
  socket.on('emergency', onEmergency);
  socket.on('automation', onAutomation);
  socket.on('order-alarm', onAlarm);
  if (socket.connected) subscribe();
  return () => {
    socket.off('connect', subscribe);
    socket.off('order', onOrder);
    socket.off('emergency', onEmergency);
    socket.off('automation', onAutomation);
    socket.off('order-alarm', onAlarm);
    if (socket.connected) socket.unsubscribeOrders({ reservoirId });
  };
}
