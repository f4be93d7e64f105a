import { Inject, Injectable } from '@nestjs/common';
import { In } from 'typeorm';
import {
  controlsOf,
  POSITION_TOLERANCE,
  travelSeconds,
  type OrderAlarm,
} from '@stillwell/shared/orders';
import { SiteClockService } from '../clock/site-clock.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { StatusService } from '../telemetry/status.service';
import { ActuatorPositions } from './actuator-positions.service';
import { ORDER_ALARM_SINK, orderAlarm, raiseAlarms, type OrderAlarmSink } from './order-alarm';
import { OrderEvents } from './order-events';
import { OrderExecution } from './order-execution.service';
import { OrderStore } from './order-store';
import { iso } from './order-view';
import { OrderRow } from './order.entity';
import { OrderCommandRow } from './order-command.entity';
import { ORDER_SETTINGS } from './order-tokens';
import type { OrderSettings } from './order-settings';

/** How a travel deadline is set: the travel time at the gate's speed, with this much to spare. */
const TRAVEL_MARGIN = 1.5;

/**
 * After a command is acknowledged: the gate's reported position, until it is in position within
 * tolerance or has failed to follow (acknowledgements themselves: OrderAcks).
 */
@Injectable()
export class OrderProgress {
  constructor(
    private readonly store: OrderStore,
    private readonly execution: OrderExecution,
    private readonly reservoirs: ReservoirsService,
    private readonly status: StatusService,
    private readonly positions: ActuatorPositions,
    private readonly clock: SiteClockService,
    private readonly events: OrderEvents,
    @Inject(ORDER_ALARM_SINK) private readonly alarmSink: OrderAlarmSink,
    @Inject(ORDER_SETTINGS) private readonly settings: OrderSettings,
  ) {}

  /**
   * Follows the positions of travelling orders (site time): in position within tolerance, or
   * 'order.not-following' when a gate has not started to move within the grace period after its
   * acknowledgement or has not arrived by its travel time with a margin.
   */
  async checkPositions(): Promise<void> {
    const travelling = await this.store.manager.findBy(OrderRow, { state: 'travelling' });
    for (const candidate of travelling) await this.checkOrder(candidate.id);
  }

  private async checkOrder(orderId: number): Promise<void> {
    const alarms: OrderAlarm[] = [];
    const changed = await this.store.transaction(async (tx) => {
      const loaded = await this.store.load(tx, orderId);
      const { row, body, order } = loaded;
      if (row.state !== 'travelling') return false;
      const now = this.clock.now(order.reservoirId);
      const controls = controlsOf(this.reservoirs.get(order.reservoirId).definition);
      const status = this.status.status(order.reservoirId);
      const commands = await tx.findBy(OrderCommandRow, {
        orderId,
        step: row.currentStep ?? 0,
        state: In(['accepted']),
      });
      let any = false;
      for (const c of commands) {
        const targets = JSON.parse(c.targets) as Record<string, number>;
        const from = JSON.parse(c.fromPositions) as Record<string, number>;
        const verdicts = Object.entries(targets).map(([id, target]) => {
          const control = controls.find((x) => x.id === id)!;
          const reported =
            this.positions.latest(order.reservoirId, control.channel)?.v ??
            status.channels.find((s) => s.channel === control.channel)?.value;
          const start = from[id] ?? 0;
          const tol = POSITION_TOLERANCE[control.kind];
          if (reported !== undefined && Math.abs(reported - target) <= tol)
            return { id, ok: true as const };
          const since = now - (c.ackAt ?? now);
          const moved =
            reported !== undefined && (reported - start) * Math.sign(target - start) > tol / 10;
          const allowed =
            travelSeconds(control, start, target) * 1000 * TRAVEL_MARGIN +
            this.settings.followGraceMs;
          const where =
            reported === undefined ? 'no position reported' : `at ${reported} ${control.unit}`;
          if (!moved && since > this.settings.followGraceMs)
            return {
              id,
              ok: false as const,
              detail: `${control.label} has not moved towards ${target} ${control.unit} (${where}, ${Math.round(since / 1000)} s after the acknowledgement)`,
            };
          if (since > allowed)
            return {
              id,
              ok: false as const,
              detail: `${control.label} has not reached ${target} ${control.unit} within ${Math.round(allowed / 1000)} s (${where})`,
            };
          return null;
        });
        const failed = verdicts.find((v) => v && !v.ok);
        if (failed && !failed.ok) {
          await tx.update(
            OrderCommandRow,
            { commandId: c.commandId },
            { state: 'not-following', reason: failed.detail },
          );
          body.fault = { code: 'not-following', detail: failed.detail, at: iso(now) };
          this.store.move(loaded, 'faulted');
          await this.store.save(tx, row, body, now);
          await this.store.log(tx, 'order.not-following', null, order, now, {
            commandId: c.commandId,
            detail: failed.detail,
          });
          alarms.push(
            orderAlarm(order.reservoirId, order.id, 'order.not-following', failed.detail, now),
          );
          return true;
        }
        if (verdicts.every((v) => v?.ok)) {
          await tx.update(
            OrderCommandRow,
            { commandId: c.commandId },
            { state: 'in-position', confirmedAt: now },
          );
          c.state = 'in-position';
          any = true;
        }
      }
      const step = row.currentStep ?? 0;
      const all = await tx.findBy(OrderCommandRow, { orderId, step });
      if (!all.every((c) => c.state === 'in-position')) return any;
      const last = step === order.steps.length - 1;
      if (last) {
        this.store.move(loaded, 'in-position');
      } else {
        this.store.move(loaded, 'holding');
        const startedAt = Date.parse(body.execution!.at);
        row.nextStepDue = Math.max(now, startedAt + order.steps[step + 1]!.offsetMin * 60_000);
      }
      await this.store.save(tx, row, body, now);
      await this.store.log(
        tx,
        last ? 'order.in-position' : 'order.step-in-position',
        null,
        order,
        now,
        {
          step,
          positions: Object.fromEntries(
            all
              .flatMap((c) => Object.keys(JSON.parse(c.targets) as object))
              .map((id) => {
                const control = controls.find((x) => x.id === id)!;
                return [id, this.positions.latest(order.reservoirId, control.channel)?.v ?? null];
              }),
          ),
          ...(last ? {} : { nextStepDue: iso(row.nextStepDue!) }),
        },
      );
      return true;
    });
    this.raise(alarms);
    if (changed) await this.store.announce(orderId);
  }

  private raise(alarms: readonly OrderAlarm[]): void {
    raiseAlarms(alarms, this.alarmSink, this.events);
  }
}
