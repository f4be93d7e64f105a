import { Injectable, Logger, OnApplicationBootstrap } from '@nestjs/common';
import {
  controlsOf,
  parseRuleTopic,
  RULE_EVENTS_SUBSCRIPTION,
  ruleEventMessageSchema,
  rulesTopic,
  type AutomaticRule,
  type AutomationEvent,
  type AutomationView,
  type RuleEventMessage,
  type RuleSetMessage,
  type UpdateRuleRequest,
} from '@stillwell/shared/orders';
import { describeIssues } from '@stillwell/shared/telemetry';
import { actorOf, type Principal } from '../auth/principal';
import { SiteClockService } from '../clock/site-clock.service';
import { LogbookService } from '../logbook/logbook.service';
import { MqttService } from '../mqtt/mqtt.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { AutomaticRuleRow, AutomationEventRow } from './automatic-rule.entity';
import { OrderError } from './order-error';
import { OrderEvents } from './order-events';
import { OrderStore } from './order-store';
import { iso } from './order-view';
import { requireCan } from './orders.service';

const toEvent = (e: AutomationEventRow): AutomationEvent => ({
  eventId: e.eventId,
  reservoirId: e.reservoirId,
  control: e.control,
  kind: e.kind as AutomationEvent['kind'],
  pool: e.pool,
  target: e.target,
  detail: e.detail,
  time: iso(e.time),
});

/**
 * Automatic rules: configured here, carried out by the gate controller (which must act even with
 * the gateway down), reported back and recorded. Only a stepped-up duty engineer changes one.
 */
@Injectable()
export class AutomationService implements OnApplicationBootstrap {
  private readonly logger = new Logger(AutomationService.name);

  constructor(
    private readonly store: OrderStore,
    private readonly reservoirs: ReservoirsService,
    private readonly mqtt: MqttService,
    private readonly clock: SiteClockService,
    private readonly logbook: LogbookService,
    private readonly events: OrderEvents,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    this.mqtt.subscribe(RULE_EVENTS_SUBSCRIPTION, (topic, payload) => {
      this.onEvent(topic, payload).catch((e: unknown) =>
        this.logger.error(`Rule event failed: ${(e as Error).stack ?? String(e)}`),
      );
    });
    // the broker may have lost its retained sets (aedes keeps them in memory): send them again
    const rows = await this.store.manager.find(AutomaticRuleRow);
    const devices = new Set(rows.map((r) => `${r.reservoirId}/${r.deviceId}`));
    for (const key of devices) {
      const [reservoirId, deviceId] = key.split('/') as [string, string];
      this.publish(reservoirId, deviceId).catch((e: unknown) =>
        this.logger.warn(`Rule set for ${key} not sent: ${(e as Error).message}`),
      );
    }
  }

  async view(reservoirId: string): Promise<AutomationView> {
    const { definition } = this.reservoirs.get(reservoirId);
    const rows = await this.store.manager.findBy(AutomaticRuleRow, { reservoirId });
    const rules = controlsOf(definition).map((c): AutomaticRule => {
      const r = rows.find((x) => x.control === c.id);
      if (!r)
        return {
          reservoirId,
          control: c.id,
          enabled: false,
          riseAbove: definition.normalMaxPool,
          target: c.max,
          revision: 0,
          updatedBy: null,
          updatedAt: null,
          device: { state: 'not-configured', detail: null },
          lastTriggeredAt: null,
        };
      return this.toRule(r);
    });
    const events = await this.store.manager.find(AutomationEventRow, {
      where: { reservoirId },
      order: { time: 'DESC' },
      take: 50,
    });
    return { rules, events: events.map(toEvent) };
  }

  async update(
    reservoirId: string,
    control: string,
    req: UpdateRuleRequest,
    p: Principal,
  ): Promise<AutomaticRule> {
    requireCan(p, 'automation.edit');
    const { definition } = this.reservoirs.get(reservoirId);
    const c = controlsOf(definition).find((x) => x.id === control);
    if (!c) throw new OrderError('rule-invalid', `control: no gate or valve "${control}"`);
    const problems: string[] = [];
    if (req.target > c.max)
      problems.push(
        `target: ${req.target} ${c.unit} is outside ${c.label}'s limits 0..${c.max} ${c.unit}`,
      );
    if (
      req.riseAbove <= definition.riverbedElevation ||
      req.riseAbove >= definition.damCrestElevation
    )
      problems.push(
        `riseAbove: ${req.riseAbove} m must lie between the riverbed (${definition.riverbedElevation} m) and the dam crest (${definition.damCrestElevation} m)`,
      );
    if (problems.length) throw new OrderError('rule-invalid', problems.join('; '));
    const rule = await this.store.transaction(async (tx) => {
      const now = this.clock.now(reservoirId);
      const before = await tx.findOneBy(AutomaticRuleRow, { reservoirId, control });
      const deviceRows = await tx.findBy(AutomaticRuleRow, { reservoirId, deviceId: c.deviceId });
      const revision = Math.max(Date.now(), ...deviceRows.map((r) => r.revision + 1));
      const row: AutomaticRuleRow = {
        reservoirId,
        control,
        deviceId: c.deviceId,
        enabled: req.enabled,
        riseAbove: req.riseAbove,
        target: req.target,
        revision,
        updatedById: p.userId,
        updatedByName: p.username,
        updatedAt: now,
        deviceState: 'pending',
        deviceDetail: null,
        lastTriggeredAt: before?.lastTriggeredAt ?? null,
      };
      await tx.save(AutomaticRuleRow, row);
      await this.logbook.append(
        {
          kind: 'config.automatic-rule',
          actor: actorOf(p),
          payload: {
            reservoirId,
            controls: [control],
            revision,
            before: before
              ? {
                  enabled: Boolean(before.enabled),
                  riseAbove: before.riseAbove,
                  target: before.target,
                }
              : null,
            after: { enabled: req.enabled, riseAbove: req.riseAbove, target: req.target },
            siteTime: iso(now),
          },
        },
        tx,
      );
      return this.toRule(row);
    });
    this.events.emit({ kind: 'automation', reservoirId, rule });
    await this.publish(reservoirId, c.deviceId);
    return rule;
  }

  /** The device's whole rule set, retained, so that the controller gets it at every connect. */
  private async publish(reservoirId: string, deviceId: string): Promise<void> {
    const rows = await this.store.manager.findBy(AutomaticRuleRow, { reservoirId, deviceId });
    const message: RuleSetMessage = {
      revision: Math.max(0, ...rows.map((r) => r.revision)),
      rules: rows.map((r) => ({
        control: r.control,
        enabled: Boolean(r.enabled),
        riseAbove: r.riseAbove,
        target: r.target,
      })),
    };
    await this.mqtt.publish(rulesTopic(reservoirId, deviceId), JSON.stringify(message), true);
  }

  async onEvent(topic: string, payload: Buffer): Promise<void> {
    const where = parseRuleTopic(topic);
    let json: unknown;
    try {
      json = JSON.parse(payload.toString('utf8'));
    } catch {
      json = null;
    }
    const parsed = ruleEventMessageSchema.safeParse(json);
    if (
      !where ||
      where.kind !== 'rule-events' ||
      !parsed.success ||
      !this.reservoirs.find(where.reservoirId)
    ) {
      this.logger.warn(
        `Ignored a rule event on ${topic}: ${parsed.success ? 'unknown topic' : describeIssues(parsed.error)}`,
      );
      return;
    }
    await this.record(where.reservoirId, where.deviceId, parsed.data);
  }

  async record(reservoirId: string, deviceId: string, e: RuleEventMessage): Promise<void> {
    const changed = await this.store.transaction(async (tx) => {
      // a repeated delivery of the same event is recorded once
      if (await tx.findOneBy(AutomationEventRow, { eventId: e.eventId })) return [];
      const now = this.clock.now(reservoirId);
      await tx.insert(AutomationEventRow, {
        eventId: e.eventId,
        reservoirId,
        deviceId,
        control: e.control ?? null,
        kind: e.kind,
        revision: e.revision,
        pool: e.pool ?? null,
        target: e.target ?? null,
        detail: e.reason ?? null,
        time: now,
      });
      const rows = await tx.findBy(AutomaticRuleRow, { reservoirId, deviceId });
      const touched: AutomaticRuleRow[] = [];
      for (const r of rows) {
        if (e.kind === 'applied' && r.revision <= e.revision && r.deviceState !== 'applied') {
          Object.assign(r, { deviceState: 'applied', deviceDetail: null });
          touched.push(r);
        } else if (e.kind === 'rejected' && r.revision === e.revision) {
          Object.assign(r, { deviceState: 'rejected', deviceDetail: e.reason ?? 'refused' });
          touched.push(r);
        } else if (e.kind === 'triggered' && r.control === e.control) {
          r.lastTriggeredAt = now;
          touched.push(r);
        }
      }
      for (const r of touched) await tx.save(AutomaticRuleRow, r);
      await this.logbook.append(
        {
          kind: `automation.${e.kind}`,
          actor: null,
          payload: {
            reservoirId,
            deviceId,
            controls: e.control ? [e.control] : rows.map((r) => r.control).sort(),
            eventId: e.eventId,
            revision: e.revision,
            by: 'gate controller',
            controllerTime: e.time,
            siteTime: iso(now),
            ...(e.pool !== undefined ? { pool: e.pool } : {}),
            ...(e.target !== undefined ? { target: e.target } : {}),
            ...(e.reason ? { reason: e.reason } : {}),
          },
        },
        tx,
      );
      return touched.map((r) => this.toRule(r));
    });
    for (const rule of changed) this.events.emit({ kind: 'automation', reservoirId, rule });
  }

  private toRule(r: AutomaticRuleRow): AutomaticRule {
    return {
      reservoirId: r.reservoirId,
      control: r.control,
      enabled: Boolean(r.enabled),
      riseAbove: r.riseAbove,
      target: r.target,
      revision: r.revision,
      updatedBy: r.updatedById ? { userId: r.updatedById, username: r.updatedByName ?? '' } : null,
      updatedAt: r.updatedAt === null ? null : iso(r.updatedAt),
      device: { state: r.deviceState as AutomaticRule['device']['state'], detail: r.deviceDetail },
      lastTriggeredAt: r.lastTriggeredAt === null ? null : iso(r.lastTriggeredAt),
    };
  }
}
