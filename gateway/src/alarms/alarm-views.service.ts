import { BadRequestException, Injectable } from '@nestjs/common';
import {
  alarmPerformance,
  compareAlarms,
  countAlarms,
  isListed,
  type AlarmAction,
  type AlarmEventList,
  type AlarmHistory,
  type AlarmList,
  type AlarmPerformance,
  type AlarmView,
} from '@stillwell/shared/alarms';
import { SiteClockService } from '../clock/site-clock.service';
import type { LogbookActor } from '../logbook/logbook.service';
import { stateOf, toEvent, toView } from './alarm-record';
import { AlarmsService } from './alarms.service';

const DAY_MS = 24 * 3_600_000;

/** The alarm screens' and the API's views: lists, histories, rates; and people's actions. */
@Injectable()
export class AlarmViewsService {
  constructor(
    private readonly alarms: AlarmsService,
    private readonly clock: SiteClockService,
  ) {}

  list(reservoirId: string): AlarmList {
    const conditions = this.alarms.conditionMap(reservoirId);
    const alarms = this.alarms.store
      .records(reservoirId)
      .filter((r) => isListed(stateOf(r)))
      .map((r) => toView(r, conditions.get(r.conditionId)))
      .sort(compareAlarms);
    return {
      reservoirId,
      siteNowMs: this.clock.now(reservoirId),
      alarms,
      counts: countAlarms(alarms),
    };
  }

  async history(reservoirId: string, conditionId: string, limit = 200): Promise<AlarmHistory> {
    const condition = this.alarms.condition(reservoirId, conditionId);
    const record = this.alarms.store.get(reservoirId, conditionId);
    const { rows } = await this.alarms.store.events(reservoirId, { conditionId, limit });
    return {
      condition,
      alarm: record ? toView(record, condition) : null,
      events: rows.map(toEvent),
    };
  }

  async events(
    reservoirId: string,
    range: { from?: string; to?: string; limit?: number },
  ): Promise<AlarmEventList> {
    this.alarms.conditionMap(reservoirId);
    const { fromMs, toMs } = this.range(reservoirId, range);
    const { rows, truncated } = await this.alarms.store.events(reservoirId, {
      fromMs,
      toMs,
      limit: range.limit ?? 1000,
    });
    return { events: rows.map(toEvent), truncated };
  }

  async performance(
    reservoirId: string,
    range: { from?: string; to?: string; operators?: number },
  ): Promise<AlarmPerformance> {
    this.alarms.conditionMap(reservoirId);
    const { fromMs, toMs } = this.range(reservoirId, range);
    const annunciations = await this.alarms.store.annunciations(reservoirId, fromMs, toMs);
    return alarmPerformance(annunciations, fromMs, toMs, range.operators ?? 1);
  }

  async act(
    reservoirId: string,
    conditionId: string,
    action: AlarmAction | { type: 'shelve-for'; reason: string; durationS: number },
    actor: LogbookActor,
  ): Promise<AlarmView> {
    const condition = this.alarms.condition(reservoirId, conditionId);
    const actionAt = (nowMs: number): AlarmAction =>
      action.type === 'shelve-for'
        ? { type: 'shelve', reason: action.reason, untilMs: nowMs + action.durationS * 1000 }
        : action;
    const record = await this.alarms.store.act(reservoirId, condition, actionAt, actor, {
      nowMs: () => this.clock.now(reservoirId),
      shelveMaxMs: this.alarms.shelveMaxMs(reservoirId),
    });
    return toView(record, condition);
  }

  private range(reservoirId: string, r: { from?: string; to?: string }) {
    const toMs = r.to ? Date.parse(r.to) : this.clock.now(reservoirId);
    const fromMs = r.from ? Date.parse(r.from) : toMs - DAY_MS;
    if (!(fromMs < toMs)) throw new BadRequestException('from must be before to');
    return { fromMs, toMs };
  }
}
