import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { ReplayEvent, ReplayEventList } from '@stillwell/shared/replay';
import { SiteClockService } from '../clock/site-clock.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { RetentionMarksService } from '../retention/retention-marks.service';
import { findHighPoolSpells, type Sample } from './high-pool';

const HOUR_MS = 3_600_000;

/**
 * Windows worth replaying, found in the record: spells of the pool above the lowest alert
 * threshold ("the storm of ..."), emergencies from declaration to end, and the whole record.
 */
@Injectable()
export class ReplayEventsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly reservoirs: ReservoirsService,
    private readonly marks: RetentionMarksService,
    private readonly clock: SiteClockService,
  ) {}

  async list(reservoirId: string, maxWindowMs: number): Promise<ReplayEventList> {
    const { definition } = this.reservoirs.get(reservoirId);
    const nowMs = this.clock.now(reservoirId);
    const channel = definition.poolChannels[0]!;
    const events: ReplayEvent[] = [];
    const alerts = definition.thresholds.filter((t) => t.kind === 'alert');
    const lowest = [...(alerts.length ? alerts : definition.thresholds)].sort(
      (a, b) => a.elevation - b.elevation,
    )[0];
    if (lowest) {
      const samples = await this.samplesAbove(reservoirId, channel, lowest.elevation);
      for (const spell of findHighPoolSpells(samples, { mergeGapMs: HOUR_MS })) {
        // the rise before and the recession after belong to the story
        const fromMs = spell.fromMs - 6 * HOUR_MS;
        const toMs = Math.min(nowMs, spell.toMs + 6 * HOUR_MS);
        events.push({
          id: `high-pool-${spell.fromMs}`,
          kind: 'high-pool',
          label: `Storm: pool above ${lowest.label} (${lowest.elevation} m)`,
          fromMs: Math.max(fromMs, toMs - maxWindowMs),
          toMs,
          ongoing: nowMs - spell.toMs < HOUR_MS,
          peak: spell.peak,
        });
      }
    }
    const emergencies = (await this.dataSource.query(
      `SELECT "id", "level", "reason", "declared_at", "ended_at" FROM "emergencies"
       WHERE "reservoir_id" = ? ORDER BY "declared_at"`,
      [reservoirId],
    )) as Array<{
      id: number;
      level: number;
      reason: string;
      declared_at: number;
      ended_at: number | null;
    }>;
    for (const e of emergencies) {
      const toMs = Math.min(nowMs, Number(e.ended_at ?? nowMs) + HOUR_MS);
      events.push({
        id: `emergency-${e.id}`,
        kind: 'emergency',
        label: `Emergency (level ${e.level}): ${e.reason}`,
        fromMs: Math.max(Number(e.declared_at) - HOUR_MS, toMs - maxWindowMs),
        toMs,
        ongoing: e.ended_at === null,
        peak: null,
      });
    }
    const record = await this.recordSpan(reservoirId, channel);
    if (record) {
      events.push({
        id: 'record',
        kind: 'record',
        label:
          record.toMs - record.fromMs > maxWindowMs
            ? 'The latest part of the record'
            : 'The whole record',
        fromMs: Math.max(record.fromMs, record.toMs - maxWindowMs),
        toMs: record.toMs,
        ongoing: nowMs - record.toMs < HOUR_MS,
        peak: null,
      });
    }
    return { events: events.sort((a, b) => b.fromMs - a.fromMs), nowMs };
  }

  /** The pool gauge's samples at or above the level: minute maxima, then raw readings after them. */
  private async samplesAbove(
    reservoirId: string,
    channel: string,
    level: number,
  ): Promise<Sample[]> {
    const { aggregatedThrough } = await this.marks.get(reservoirId);
    const minutes = (await this.dataSource.query(
      `SELECT "max_time" AS "t", "max" AS "v" FROM "reading_aggregates"
       WHERE "reservoir_id" = ? AND "channel" = ? AND "max" >= ? ORDER BY "minute"`,
      [reservoirId, channel, level],
    )) as Sample[];
    const raw = (await this.dataSource.query(
      `SELECT "time" AS "t", "value" AS "v" FROM "readings"
       WHERE "reservoir_id" = ? AND "channel" = ? AND "time" >= ? AND "value" >= ? AND "quality" <> 'bad'
       ORDER BY "time"`,
      [reservoirId, channel, aggregatedThrough ?? 0, level],
    )) as Sample[];
    return [...minutes, ...raw].map((s) => ({ t: Number(s.t), v: s.v }));
  }

  private async recordSpan(
    reservoirId: string,
    channel: string,
  ): Promise<{ fromMs: number; toMs: number } | null> {
    const [r] = (await this.dataSource.query(
      `SELECT MIN("time") AS "a", MAX("time") AS "b" FROM "readings" WHERE "reservoir_id" = ? AND "channel" = ?`,
      [reservoirId, channel],
    )) as Array<{ a: number | null; b: number | null }>;
    const [m] = (await this.dataSource.query(
      `SELECT MIN("minute") AS "a", MAX("minute") AS "b" FROM "reading_aggregates" WHERE "reservoir_id" = ? AND "channel" = ?`,
      [reservoirId, channel],
    )) as Array<{ a: number | null; b: number | null }>;
    const starts = [r?.a, m?.a].filter((x): x is number => x !== null && x !== undefined);
    const ends = [r?.b, m?.b].filter((x): x is number => x !== null && x !== undefined);
    if (!starts.length || !ends.length) return null;
    return { fromMs: Math.min(...starts.map(Number)), toMs: Math.max(...ends.map(Number)) };
  }
}
