import { Injectable, Logger, OnApplicationBootstrap, OnModuleDestroy } from '@nestjs/common';
import type { Subscription } from 'rxjs';
import type { OrderAlarm } from '@stillwell/shared/orders';
import { OrderEvents } from '../orders/order-events';
import { AlarmsService } from './alarms.service';

/** The order fault kinds of the gate-orders module and the alarm each raises. */
export const ORDER_FAULT_CONDITIONS: Readonly<Record<OrderAlarm['kind'], string>> = {
  'order.not-following': 'order-not-following',
  'order.ack-missing': 'order-ack-missing',
  'order.command-rejected': 'order-command-refused',
};

/**
 * Turns the gate-orders module's order alarms (events without an end) into alarms with a
 * lifecycle: raised when an order faults, cleared once no order is left faulted for that reason.
 */
@Injectable()
export class OrderAlarmBridge implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(OrderAlarmBridge.name);
  /** faulted orders by reservoir and condition */
  private readonly faulted = new Map<string, Map<string, Set<number>>>();
  private subscription?: Subscription;

  constructor(
    private readonly events: OrderEvents,
    private readonly alarms: AlarmsService,
  ) {}

  onApplicationBootstrap(): void {
    this.subscription = this.events.events$.subscribe((e) => {
      if (e.kind === 'alarm') void this.raised(e.alarm);
      else if (e.kind === 'order' && e.order.state !== 'faulted')
        void this.settled(e.reservoirId, e.order.id);
    });
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
  }

  private async raised(alarm: OrderAlarm): Promise<void> {
    const conditionId = ORDER_FAULT_CONDITIONS[alarm.kind];
    const orders = this.of(alarm.reservoirId, conditionId);
    orders.add(alarm.orderId);
    await this.alarms
      .raise(alarm.reservoirId, conditionId, { message: `order ${alarm.orderId}: ${alarm.detail}` })
      .catch((error: unknown) => this.logger.error(`Order alarm not raised: ${String(error)}`));
  }

  private async settled(reservoirId: string, orderId: number): Promise<void> {
    for (const [conditionId, orders] of this.faulted.get(reservoirId) ?? []) {
      if (!orders.delete(orderId) || orders.size > 0) continue;
      await this.alarms
        .clear(reservoirId, conditionId, { message: `order ${orderId} is no longer faulted` })
        .catch((error: unknown) => this.logger.error(`Order alarm not cleared: ${String(error)}`));
    }
  }

  private of(reservoirId: string, conditionId: string): Set<number> {
    let byCondition = this.faulted.get(reservoirId);
    if (!byCondition) this.faulted.set(reservoirId, (byCondition = new Map()));
    let set = byCondition.get(conditionId);
    if (!set) byCondition.set(conditionId, (set = new Set()));
    return set;
  }
}
