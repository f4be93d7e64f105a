import { Inject, Injectable, Logger } from '@nestjs/common';
import {
  commandAckMessageSchema,
  type CommandAckMessage,
  type OrderAlarm,
} from '@stillwell/shared/orders';
import { SiteClockService } from '../clock/site-clock.service';
import { ORDER_ALARM_SINK, orderAlarm, raiseAlarms, type OrderAlarmSink } from './order-alarm';
import { OrderEvents } from './order-events';
import { OrderExecution } from './order-execution.service';
import { OrderStore } from './order-store';
import { iso } from './order-view';
import { OrderCommandRow } from './order-command.entity';
import { ORDER_SETTINGS } from './order-tokens';
import type { OrderSettings } from './order-settings';

/**
 * The gate controllers' answers to commands, and their absence: a command without an answer is
 * sent again under the same id after half the timeout (the controller moves once), and the order
 * faulted with 'order.ack-missing' after all of it.
 */
@Injectable()
export class OrderAcks {
  private readonly logger = new Logger(OrderAcks.name);

  constructor(
    private readonly store: OrderStore,
    private readonly execution: OrderExecution,
    private readonly clock: SiteClockService,
    private readonly events: OrderEvents,
    @Inject(ORDER_ALARM_SINK) private readonly alarmSink: OrderAlarmSink,
    @Inject(ORDER_SETTINGS) private readonly settings: OrderSettings,
  ) {}

  /** An acknowledgement from a gate controller (raw MQTT payload). */
  async onAck(payload: Buffer): Promise<void> {
    let json: unknown;
    try {
      json = JSON.parse(payload.toString('utf8'));
    } catch {
      json = null;
    }
    const parsed = commandAckMessageSchema.safeParse(json);
    if (!parsed.success) {
      this.logger.warn(
        `Ignored an unreadable acknowledgement: ${payload.toString('utf8').slice(0, 200)}`,
      );
      return;
    }
    await this.handleAck(parsed.data);
  }

  async handleAck(ack: CommandAckMessage): Promise<void> {
    const alarms: OrderAlarm[] = [];
    const id = await this.store.transaction(async (tx) => {
      const command = await tx.findOneBy(OrderCommandRow, { commandId: ack.commandId });
      // not ours (another gateway, a hand test), or a repeat of an answer already taken
      if (!command || (command.state !== 'sent' && command.state !== 'ack-missing')) return null;
      const loaded = await this.store.load(tx, command.orderId);
      const { row, body, order } = loaded;
      const now = this.clock.now(order.reservoirId);
      const late = command.state === 'ack-missing';
      command.ackAt = now;
      command.reason = ack.reason ?? null;
      command.state = ack.status;
      await tx.save(OrderCommandRow, command);
      await this.store.log(
        tx,
        ack.status === 'accepted' ? 'command.acknowledged' : 'command.rejected',
        null,
        order,
        now,
        {
          commandId: ack.commandId,
          step: command.step,
          controllerTime: ack.time,
          ...(ack.reason ? { reason: ack.reason } : {}),
          ...(late
            ? {
                late: true,
                note: 'answered after the acknowledgement timeout; the order stays faulted',
              }
            : {}),
        },
      );
      if (late) return order.id;
      if (ack.status === 'rejected') {
        body.fault = {
          code: 'command-rejected',
          detail: `the controller refused ${ack.commandId}: ${ack.reason ?? 'no reason'}`,
          at: iso(now),
        };
        this.store.move(loaded, 'faulted');
        await this.store.save(tx, row, body, now);
        alarms.push(
          orderAlarm(order.reservoirId, order.id, 'order.command-rejected', body.fault.detail, now),
        );
        return order.id;
      }
      const siblings = await tx.findBy(OrderCommandRow, { orderId: order.id, step: command.step });
      if (row.state === 'dispatched' && siblings.every((c) => c.state === 'accepted')) {
        this.store.move(loaded, 'travelling');
        await this.store.save(tx, row, body, now);
      }
      return order.id;
    });
    this.raise(alarms);
    if (id !== null) await this.store.announce(id);
  }

  /**
   * Commands without an answer: sent again (same command id) after half the timeout, the order
   * faulted with 'order.ack-missing' after all of it. Wall time: it measures the link.
   */
  async checkAckDeadlines(wallNow = Date.now()): Promise<void> {
    const timeout = this.settings.ackTimeoutMs;
    const waiting = await this.store.manager.findBy(OrderCommandRow, { state: 'sent' });
    for (const c of waiting) {
      if (c.sentWall === null) continue;
      const waited = wallNow - c.sentWall;
      if (waited >= timeout) await this.ackMissing(c.commandId, waited);
      else if (waited >= timeout / 2 && !c.resent) await this.resend(c);
    }
  }

  private async resend(c: OrderCommandRow): Promise<void> {
    await this.store.transaction(async (tx) => {
      await tx.update(OrderCommandRow, { commandId: c.commandId }, { resent: true });
      const { order } = await this.store.load(tx, c.orderId);
      await this.store.log(tx, 'command.resent', null, order, this.clock.now(order.reservoirId), {
        commandId: c.commandId,
        note: 'no acknowledgement yet: sent again under the same command id (the controller moves once)',
      });
    });
    await this.execution.send([c]);
  }

  private async ackMissing(commandId: string, waitedMs: number): Promise<void> {
    const alarms: OrderAlarm[] = [];
    const id = await this.store.transaction(async (tx) => {
      const c = await tx.findOneBy(OrderCommandRow, { commandId });
      if (!c || c.state !== 'sent') return null;
      const loaded = await this.store.load(tx, c.orderId);
      const { row, body, order } = loaded;
      const now = this.clock.now(order.reservoirId);
      await tx.update(OrderCommandRow, { commandId }, { state: 'ack-missing' });
      const detail = `no acknowledgement of ${commandId} from ${c.deviceId} within ${(waitedMs / 1000).toFixed(1)} s`;
      if (row.state === 'dispatched' || row.state === 'travelling') {
        body.fault = { code: 'ack-missing', detail, at: iso(now) };
        this.store.move(loaded, 'faulted');
        await this.store.save(tx, row, body, now);
      }
      await this.store.log(tx, 'order.ack-missing', null, order, now, {
        commandId,
        deviceId: c.deviceId,
        detail,
      });
      alarms.push(orderAlarm(order.reservoirId, order.id, 'order.ack-missing', detail, now));
      return order.id;
    });
    this.raise(alarms);
    if (id !== null) await this.store.announce(id);
  }

  private raise(alarms: readonly OrderAlarm[]): void {
    raiseAlarms(alarms, this.alarmSink, this.events);
  }
}
