import { randomUUID } from 'node:crypto';
import { Injectable, Logger } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import {
  controlsOf,
  executeRefusal,
  refusalsOf,
  type InterlockReport,
  type Order,
} from '@stillwell/shared/orders';
import { commandTopic } from '@stillwell/shared/telemetry';
import { actorOf, type Principal } from '../auth/principal';
import { SiteClockService } from '../clock/site-clock.service';
import { MqttService } from '../mqtt/mqtt.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { StatusService } from '../telemetry/status.service';
import { EmergencyService } from './emergency.service';
import { InterlocksService } from './interlocks.service';
import { OrderError } from './order-error';
import { OrderStore, type LoadedOrder } from './order-store';
import { iso } from './order-view';
import { OrderRow } from './order.entity';
import { OrderCommandRow } from './order-command.entity';
import { refuse, requireCan } from './orders.service';

/**
 * Executing orders: the interlocks, then one command per gate controller per step, published at
 * QoS 1 under a unique command id that a retry repeats (the controller is idempotent by it).
 */
@Injectable()
export class OrderExecution {
  private readonly logger = new Logger(OrderExecution.name);

  constructor(
    private readonly store: OrderStore,
    private readonly interlocks: InterlocksService,
    private readonly emergencies: EmergencyService,
    private readonly reservoirs: ReservoirsService,
    private readonly status: StatusService,
    private readonly clock: SiteClockService,
    private readonly mqtt: MqttService,
  ) {}

  /** The interlocks of an order's next step, as they stand now (for the console to show). */
  async preview(id: number): Promise<InterlockReport> {
    const { order } = await this.store.load(this.store.manager, id);
    const emergency = await this.emergencies.current(order.reservoirId);
    const busy = await this.store.busyControls(this.store.manager, order.reservoirId);
    const step = order.state === 'holding' ? (order.currentStep ?? 0) + 1 : 0;
    return (
      await this.interlocks.evaluate(
        order,
        Math.min(step, order.steps.length - 1),
        emergency !== null,
        busy,
      )
    ).report;
  }

  /**
   * An operator executes an authorised order, or, under a declared emergency, a proposed one
   * (flagged and awaiting countersignature, as is any order whose checks the emergency waived).
   */
  async execute(id: number, p: Principal): Promise<Order> {
    requireCan(p, 'orders.execute');
    const sent = await this.store.transaction(async (tx) => {
      const loaded = await this.store.load(tx, id);
      const { row, body, order } = loaded;
      const now = this.clock.now(order.reservoirId);
      const emergency = await this.emergencies.current(order.reservoirId, tx);
      refuse(executeRefusal(order, emergency, now));
      const busy = await this.store.busyControls(tx, order.reservoirId);
      const { report, clearance } = await this.interlocks.evaluate(
        order,
        0,
        emergency !== null,
        busy,
      );
      if (!report.ok) {
        throw new OrderError(
          'interlock',
          refusalsOf(report)
            .map((r) => r.message)
            .join(' '),
          report,
        );
      }
      const withoutAuthorisation = order.state === 'proposed';
      const waived = report.results.filter((r) => r.waived).map((r) => r.code);
      const flagged = withoutAuthorisation || waived.length > 0;
      body.execution = {
        by: { userId: p.userId, username: p.username },
        at: iso(now),
        waived,
        clearance,
      };
      row.emergency = flagged;
      row.emergencyId = flagged ? (emergency?.id ?? null) : null;
      row.awaitingCountersign = flagged;
      await this.store.log(tx, 'order.executed', actorOf(p), order, now, {
        withoutAuthorisation,
        emergency: flagged,
        emergencyId: row.emergencyId,
        authorisedBy: order.decision?.outcome === 'authorised' ? order.decision.by.username : null,
        interlocks: report.results,
        clearance,
      });
      return this.startStep(tx, loaded, 0, now);
    });
    await this.store.announce(id);
    await this.send(sent);
    return this.store.view(id);
  }

  /** Holding orders whose next step is due: checked again, then sent (or faulted with the reason). */
  async dispatchDue(): Promise<void> {
    const due = await this.store.manager.findBy(OrderRow, { state: 'holding' });
    for (const candidate of due) {
      const now = this.clock.now(candidate.reservoirId);
      if (candidate.nextStepDue === null || candidate.nextStepDue > now) continue;
      const sent = await this.store.transaction(async (tx) => {
        const loaded = await this.store.load(tx, candidate.id);
        const { row, body, order } = loaded;
        if (row.state !== 'holding' || row.nextStepDue === null || row.nextStepDue > now) return [];
        const step = (row.currentStep ?? 0) + 1;
        const emergency = await this.emergencies.current(order.reservoirId, tx);
        const busy = await this.store.busyControls(tx, order.reservoirId);
        const { report } = await this.interlocks.evaluate(order, step, emergency !== null, busy);
        if (!report.ok) {
          const detail = refusalsOf(report)
            .map((r) => r.message)
            .join(' ');
          body.fault = {
            code: 'interlock',
            detail: `step ${step + 1} not sent: ${detail}`,
            at: iso(now),
          };
          this.store.move(loaded, 'faulted');
          row.nextStepDue = null;
          await this.store.save(tx, row, body, now);
          await this.store.log(tx, 'order.faulted', null, order, now, {
            fault: 'interlock',
            step,
            interlocks: report.results,
          });
          return [];
        }
        await this.store.log(tx, 'order.step-started', null, order, now, {
          step,
          interlocks: report.results,
        });
        return this.startStep(tx, loaded, step, now);
      });
      await this.store.announce(candidate.id);
      await this.send(sent);
    }
  }

  /** Queues the commands of a step (one per gate controller) and marks the order dispatched. */
  private async startStep(
    tx: EntityManager,
    loaded: LoadedOrder,
    step: number,
    now: number,
  ): Promise<OrderCommandRow[]> {
    const { row, body, order } = loaded;
    const { definition } = this.reservoirs.get(order.reservoirId);
    const controls = controlsOf(definition);
    const status = this.status.status(order.reservoirId);
    const byDevice = new Map<
      string,
      { targets: Record<string, number>; from: Record<string, number> }
    >();
    for (const t of order.steps[step]!.targets) {
      const c = controls.find((x) => x.id === t.control)!;
      const entry = byDevice.get(c.deviceId) ?? { targets: {}, from: {} };
      entry.targets[c.id] = t.target;
      entry.from[c.id] = status.channels.find((s) => s.channel === c.channel)?.value ?? 0;
      byDevice.set(c.deviceId, entry);
    }
    const commands: OrderCommandRow[] = [];
    for (const [deviceId, { targets, from }] of byDevice) {
      // unique across restarts and databases: a controller that remembers an old id would
      // answer it again without moving (it is idempotent by command id)
      const commandId = `go-${order.id}-s${step + 1}-${randomUUID().slice(0, 8)}`;
      commands.push(
        await tx.save(OrderCommandRow, {
          commandId,
          orderId: order.id,
          step,
          deviceId,
          targets: JSON.stringify(targets),
          fromPositions: JSON.stringify(from),
          state: 'sent',
          sentAt: now,
          sentWall: Date.now(),
          resent: false,
          ackAt: null,
          reason: null,
          confirmedAt: null,
        }),
      );
    }
    this.store.move(loaded, 'dispatched');
    row.currentStep = step;
    row.nextStepDue = null;
    await this.store.save(tx, row, body, now);
    for (const c of commands) {
      await this.store.log(tx, 'command.sent', null, order, now, {
        commandId: c.commandId,
        step,
        deviceId: c.deviceId,
        targets: JSON.parse(c.targets),
      });
    }
    return commands;
  }

  /** Publishes queued commands after their commit; a failure to publish faults the order. */
  async send(commands: readonly OrderCommandRow[]): Promise<void> {
    for (const c of commands) {
      try {
        await this.publish(c);
      } catch (error) {
        await this.publishFailed(c, (error as Error).message);
      }
    }
  }

  async publish(c: OrderCommandRow): Promise<void> {
    const { definition } = this.reservoirs.get((await this.store.view(c.orderId)).reservoirId);
    const controls = controlsOf(definition);
    const targets = JSON.parse(c.targets) as Record<string, number>;
    const gates: Record<string, number> = {};
    const valves: Record<string, number> = {};
    for (const [id, v] of Object.entries(targets))
      (controls.find((x) => x.id === id)?.kind === 'valve' ? valves : gates)[id] = v;
    const message = {
      commandId: c.commandId,
      ...(Object.keys(gates).length ? { gates } : {}),
      ...(Object.keys(valves).length ? { valves } : {}),
    };
    await this.mqtt.publish(commandTopic(definition.id, c.deviceId), JSON.stringify(message));
  }

  private async publishFailed(c: OrderCommandRow, why: string): Promise<void> {
    this.logger.error(`Command ${c.commandId} could not be published: ${why}`);
    const id = await this.store.transaction(async (tx) => {
      const loaded = await this.store.load(tx, c.orderId);
      const { row, body, order } = loaded;
      const now = this.clock.now(order.reservoirId);
      await tx.update(
        OrderCommandRow,
        { commandId: c.commandId },
        { state: 'ack-missing', reason: why },
      );
      if (row.state === 'dispatched') {
        body.fault = {
          code: 'publish-failed',
          detail: `command ${c.commandId} not published: ${why}`,
          at: iso(now),
        };
        this.store.move(loaded, 'faulted');
        await this.store.save(tx, row, body, now);
      }
      await this.store.log(tx, 'order.faulted', null, order, now, {
        fault: 'publish-failed',
        commandId: c.commandId,
        detail: why,
      });
      return order.id;
    });
    await this.store.announce(id);
  }

  /** Authorisations whose time ran out (site time): lapsed, recorded. */
  async lapseExpired(): Promise<void> {
    const rows = await this.store.manager.findBy(OrderRow, { state: 'authorised' });
    for (const candidate of rows) {
      const now = this.clock.now(candidate.reservoirId);
      const lapsed = await this.store.transaction(async (tx) => {
        const loaded = await this.store.load(tx, candidate.id);
        const { row, body, order } = loaded;
        if (row.state !== 'authorised' || row.authorisedUntil === null || row.authorisedUntil > now)
          return false;
        this.store.move(loaded, 'lapsed');
        await this.store.save(tx, row, body, now);
        await this.store.log(tx, 'order.lapsed', null, order, now, {
          authorisedUntil: iso(row.authorisedUntil),
        });
        return true;
      });
      if (lapsed) await this.store.announce(candidate.id);
    }
  }
}
