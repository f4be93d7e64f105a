import { Injectable, Logger } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { Subject } from 'rxjs';
import { DataSource, type EntityManager } from 'typeorm';
import {
  applyAction,
  applyCondition,
  displayState,
  expireShelf,
  type AlarmAction,
  type AlarmCondition,
  type AlarmEventKind,
  type Annunciation,
  type ConditionChange,
  type Priority,
} from '@stillwell/shared/alarms';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService, type LogbookActor } from '../logbook/logbook.service';
import { AlarmEventRow } from './alarm-event.entity';
import { AlarmRefusedError } from './alarm-errors';
import { newRecord, stateOf, toRow, withState, type AlarmRecord } from './alarm-record';
import { AlarmRow } from './alarm.entity';

/** Logbook kinds of the alarm actions people take (and of a shelf that runs out). */
export const ALARM_LOGBOOK_KINDS: Readonly<Record<AlarmAction['type'] | 'shelf-expired', string>> =
  {
    acknowledge: 'alarm.acknowledged',
    shelve: 'alarm.shelved',
    'remove-from-service': 'alarm.removed-from-service',
    'return-to-service': 'alarm.returned-to-service',
    'shelf-expired': 'alarm.shelf-expired',
  };

const EVENT_OF: Readonly<Record<AlarmAction['type'], AlarmEventKind>> = {
  acknowledge: 'acknowledged',
  shelve: 'shelved',
  'remove-from-service': 'removed-from-service',
  'return-to-service': 'returned-to-service',
};

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

/**
 * Every alarm's state, in memory for the screens and in SQLite for the record. All changes run as
 * jobs of the one write queue, so a condition change and a person's action never interleave: each
 * job reads the state the previous one left, writes it with its history (and, for people's
 * actions, its logbook entry) in one transaction, and only then takes it as the state.
 */
@Injectable()
export class AlarmStore {
  private readonly logger = new Logger(AlarmStore.name);
  private readonly byReservoir = new Map<string, Map<string, AlarmRecord>>();
  /** the reservoir whose alarms changed, after the change is committed (the live push) */
  readonly changed$ = new Subject<string>();

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
  ) {}

  async load(): Promise<void> {
    for (const row of await this.dataSource.getRepository(AlarmRow).find()) {
      this.of(row.reservoirId).set(row.conditionId, {
        ...row,
        active: Boolean(row.active),
        acknowledged: Boolean(row.acknowledged),
      });
    }
  }

  records(reservoirId: string): AlarmRecord[] {
    return [...this.of(reservoirId).values()];
  }

  get(reservoirId: string, conditionId: string): AlarmRecord | undefined {
    return this.of(reservoirId).get(conditionId);
  }

  /** Raises and clears from the engine (or an external source), with their history rows. */
  applyChanges(
    reservoirId: string,
    changes: readonly ConditionChange[],
    conditions: ReadonlyMap<string, AlarmCondition>,
  ): Promise<void> {
    return this.writes
      .run(() =>
        this.dataSource.transaction(async (tx) => {
          const next = new Map<string, AlarmRecord>();
          for (const c of changes) {
            const condition = conditions.get(c.conditionId);
            if (!condition) continue;
            const before =
              next.get(c.conditionId) ??
              this.get(reservoirId, c.conditionId) ??
              newRecord(reservoirId, condition, c.timeMs);
            const { state, annunciated } = applyCondition(stateOf(before), c.change);
            const raise = c.change === 'raise';
            const after: AlarmRecord = {
              ...withState(before, state, c.timeMs),
              kind: condition.kind,
              label: condition.label,
              priority: condition.priority,
              raisedAt: raise ? c.timeMs : before.raisedAt,
              clearedAt: raise ? null : c.timeMs,
              activations: before.activations + (raise ? 1 : 0),
              value: c.value,
              limitValue: c.limit,
              message: c.message,
            };
            next.set(c.conditionId, after);
            await this.event(tx, after, raise ? 'raised' : 'cleared', c.timeMs, {
              annunciated,
              text: c.message,
              value: c.value,
            });
          }
          for (const r of next.values()) await tx.save(AlarmRow, toRow(r));
          for (const [id, r] of next) this.of(reservoirId).set(id, r);
          return next.size > 0;
        }),
      )
      .then((changed) => {
        if (changed) this.changed$.next(reservoirId);
      });
  }

  /**
   * A person's action, refused with its code when the lifecycle does not allow it. The action is
   * made from the site time when its job runs, so a shelf queued behind other writes still lasts
   * as long as asked.
   */
  act(
    reservoirId: string,
    condition: AlarmCondition,
    actionAt: (nowMs: number) => AlarmAction,
    actor: LogbookActor,
    ctx: { nowMs: () => number; shelveMaxMs: number },
  ): Promise<AlarmRecord> {
    return this.writes
      .run(() => {
        const nowMs = ctx.nowMs();
        const action = actionAt(nowMs);
        const before =
          this.get(reservoirId, condition.id) ?? newRecord(reservoirId, condition, nowMs);
        const result = applyAction(stateOf(before), action, {
          nowMs,
          shelveMaxMs: ctx.shelveMaxMs,
        });
        if (!result.ok) throw new AlarmRefusedError(result.refusal, result.message);
        let after = withState(before, result.state, nowMs);
        if (action.type === 'acknowledge') {
          after = { ...after, acknowledgedAt: nowMs, acknowledgedBy: actor.username };
        } else if (action.type === 'shelve' || action.type === 'remove-from-service') {
          after = { ...after, handledBy: actor.username };
        }
        const text =
          action.type === 'shelve' || action.type === 'remove-from-service'
            ? action.reason.trim()
            : (action.comment?.trim() ?? '') || null;
        return this.dataSource.transaction(async (tx) => {
          await tx.save(AlarmRow, toRow(after));
          const { seq } = await this.logbook.append(
            {
              kind: ALARM_LOGBOOK_KINDS[action.type],
              actor,
              payload: {
                reservoirId,
                conditionId: condition.id,
                label: condition.label,
                priority: condition.priority,
                siteTime: iso(nowMs),
                from: displayState(stateOf(before)),
                to: displayState(result.state),
                ...(action.type === 'acknowledge' || action.type === 'return-to-service'
                  ? { comment: text }
                  : { reason: text }),
                ...(action.type === 'shelve' ? { shelvedUntil: iso(action.untilMs) } : {}),
              },
            },
            tx,
          );
          await this.event(tx, after, EVENT_OF[action.type], nowMs, {
            actor,
            text,
            logbookSeq: seq,
          });
          this.of(reservoirId).set(condition.id, after);
          return after;
        });
      })
      .then((after) => {
        this.changed$.next(reservoirId);
        return after;
      });
  }

  /** Shelves that have run out (site time) return to service, each with a logbook entry. */
  expireShelves(reservoirId: string, nowMs: number): Promise<void> {
    const due = this.records(reservoirId).filter((r) => expireShelf(stateOf(r), nowMs) !== null);
    if (!due.length) return Promise.resolve();
    return this.writes
      .run(() =>
        this.dataSource.transaction(async (tx) => {
          for (const r of due) {
            const current = this.get(reservoirId, r.conditionId)!;
            const state = expireShelf(stateOf(current), nowMs);
            if (!state) continue;
            const after = withState(current, state, nowMs);
            await tx.save(AlarmRow, toRow(after));
            const { seq } = await this.logbook.append(
              {
                kind: ALARM_LOGBOOK_KINDS['shelf-expired'],
                actor: null,
                payload: {
                  reservoirId,
                  conditionId: r.conditionId,
                  label: r.label,
                  siteTime: iso(nowMs),
                  shelvedUntil: iso(current.shelvedUntil),
                  reason: current.reason,
                  to: displayState(state),
                },
              },
              tx,
            );
            await this.event(tx, after, 'shelf-expired', nowMs, {
              text: current.reason,
              logbookSeq: seq,
            });
            this.of(reservoirId).set(r.conditionId, after);
          }
        }),
      )
      .then(() => this.changed$.next(reservoirId))
      .catch((error: unknown) => this.logger.error(`Shelf expiry failed: ${String(error)}`));
  }

  async events(
    reservoirId: string,
    q: {
      conditionId?: string;
      fromMs?: number;
      toMs?: number;
      limit: number;
      annunciatedOnly?: boolean;
    },
  ): Promise<{ rows: AlarmEventRow[]; truncated: boolean }> {
    const qb = this.dataSource
      .getRepository(AlarmEventRow)
      .createQueryBuilder('e')
      .where('e.reservoir_id = :reservoirId', { reservoirId });
    if (q.conditionId) qb.andWhere('e.condition_id = :c', { c: q.conditionId });
    if (q.fromMs !== undefined) qb.andWhere('e.site_time >= :from', { from: q.fromMs });
    if (q.toMs !== undefined) qb.andWhere('e.site_time < :to', { to: q.toMs });
    if (q.annunciatedOnly) qb.andWhere('e.annunciated = 1');
    const rows = await qb
      .orderBy('e.site_time', 'DESC')
      .addOrderBy('e.id', 'DESC')
      .limit(q.limit + 1)
      .getMany();
    return { rows: rows.slice(0, q.limit), truncated: rows.length > q.limit };
  }

  async annunciations(reservoirId: string, fromMs: number, toMs: number): Promise<Annunciation[]> {
    const rows: Array<{ condition_id: string; site_time: number; priority: string }> =
      await this.dataSource.query(
        `SELECT condition_id, site_time, priority FROM alarm_events
       WHERE reservoir_id = ? AND annunciated = 1 AND site_time >= ? AND site_time < ? ORDER BY site_time`,
        [reservoirId, fromMs, toMs],
      );
    return rows.map((r) => ({
      conditionId: r.condition_id,
      timeMs: r.site_time,
      priority: r.priority as Priority,
    }));
  }

  private event(
    tx: EntityManager,
    r: AlarmRecord,
    kind: AlarmEventKind,
    siteTime: number,
    extra: {
      annunciated?: boolean;
      actor?: LogbookActor;
      text?: string | null;
      value?: number | null;
      logbookSeq?: number;
    },
  ): Promise<unknown> {
    return tx.insert(AlarmEventRow, {
      reservoirId: r.reservoirId,
      conditionId: r.conditionId,
      kind,
      siteTime,
      wallTime: Date.now(),
      priority: r.priority,
      annunciated: extra.annunciated ?? false,
      actorId: extra.actor?.userId ?? null,
      actorName: extra.actor?.username ?? null,
      text: extra.text ?? null,
      value: extra.value ?? null,
      logbookSeq: extra.logbookSeq ?? null,
    });
  }

  private of(reservoirId: string): Map<string, AlarmRecord> {
    let m = this.byReservoir.get(reservoirId);
    if (!m) this.byReservoir.set(reservoirId, (m = new Map()));
    return m;
  }
}
