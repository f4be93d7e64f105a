import { Injectable, Logger } from '@nestjs/common';
import type { OrderAlarm } from '@stillwell/shared/orders';
import type { OrderEvents } from './order-events';

/**
 * Where an order's alarm goes (no acknowledgement, a position that does not follow, a refused
 * command). The alarms module provides this token to raise a real alarm with its lifecycle; until
 * then the order is marked, the logbook records it and consoles get the `order-alarm` event.
 */
export const ORDER_ALARM_SINK = Symbol('ORDER_ALARM_SINK');

export interface OrderAlarmSink {
  raise(alarm: OrderAlarm): void;
}

@Injectable()
export class LogOnlyAlarmSink implements OrderAlarmSink {
  private readonly logger = new Logger('OrderAlarms');

  raise(alarm: OrderAlarm): void {
    this.logger.warn(`${alarm.kind} on order ${alarm.orderId}: ${alarm.detail}`);
  }
}

export function orderAlarm(
  reservoirId: string,
  orderId: number,
  kind: OrderAlarm['kind'],
  detail: string,
  now: number,
): OrderAlarm {
  return { kind, reservoirId, orderId, detail, at: new Date(now).toISOString() };
}

/** Raised only once the transaction that recorded them has committed. */
export function raiseAlarms(
  alarms: readonly OrderAlarm[],
  sink: OrderAlarmSink,
  events: OrderEvents,
): void {
  for (const alarm of alarms) {
    // the hook for the alarms module (ORDER_ALARM_SINK); the console hears of it at once
    sink.raise(alarm);
    events.emit({ kind: 'alarm', reservoirId: alarm.reservoirId, alarm });
  }
}
