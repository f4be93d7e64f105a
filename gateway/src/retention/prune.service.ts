import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { ConfigService } from '@nestjs/config';
import { DataSource } from 'typeorm';
import type { Env } from '../config';
import { WriteQueueService } from '../database/write-queue.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import {
  firstReadingAfter,
  rawReadings,
  rollUpHours,
  writeAggregates,
  type Queryable,
} from './aggregate-sql';
import { CHUNK_MS } from './aggregation.service';
import { floorMinute, foldMinutes } from './minute-aggregates';
import { RetentionMarksService } from './retention-marks.service';

const DAY_MS = 86_400_000;

/**
 * Deletes raw readings older than READINGS_RETENTION_DAYS (site time), and only in minutes the
 * aggregate job has passed. Before deleting a minute it checks that the aggregate counts every
 * raw reading of it; a minute that gained readings late is recomputed from raw first. Only the
 * readings table is touched: the logbook, forecast runs and aggregates are never pruned.
 */
@Injectable()
export class PruneService {
  readonly retentionMs: number;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly reservoirs: ReservoirsService,
    private readonly marks: RetentionMarksService,
    config: ConfigService<Env, true>,
  ) {
    this.retentionMs = config.get('READINGS_RETENTION_DAYS', { infer: true }) * DAY_MS;
  }

  /** Prunes what is due at site time `nowMs`; returns the raw readings deleted. */
  async prune(reservoirId: string, nowMs: number): Promise<number> {
    const channels = [...this.reservoirs.get(reservoirId).channels.keys()];
    const cutoff = floorMinute(nowMs - this.retentionMs);
    let deleted = 0;
    // one write job per chunk, so other writes interleave while a backlog catches up
    for (;;) {
      const done = await this.writes.run(() =>
        this.dataSource.transaction(async (tx) => {
          const marks = await this.marks.get(reservoirId, tx);
          if (marks.aggregatedThrough === null) return null;
          const limit = Math.min(cutoff, marks.aggregatedThrough);
          const from = marks.prunedThrough;
          if (from >= limit) return null;
          const first = await firstReadingAfter(tx, reservoirId, channels, from);
          const start = first === null ? limit : Math.max(from, floorMinute(first));
          const end = Math.min(start + CHUNK_MS, limit);
          let n = 0;
          for (const channel of channels) {
            if (start >= end) break;
            n += await this.pruneChannel(tx, reservoirId, channel, start, end);
          }
          await this.marks.set(tx, reservoirId, { ...marks, prunedThrough: Math.max(end, from) });
          return { n, caughtUp: end >= limit };
        }),
      );
      if (!done) break;
      deleted += done.n;
      if (done.caughtUp) break;
    }
    return deleted;
  }

  private async pruneChannel(
    tx: Queryable,
    reservoirId: string,
    channel: string,
    start: number,
    end: number,
  ): Promise<number> {
    const raw = await rawReadings(tx, reservoirId, channel, start, end);
    if (!raw.length) return 0;
    const stored = (await tx.query(
      `SELECT "minute", "count", "bad_count" AS "bad" FROM "reading_aggregates"
       WHERE "reservoir_id" = ? AND "channel" = ? AND "minute" >= ? AND "minute" < ?`,
      [reservoirId, channel, start, end],
    )) as Array<{ minute: number; count: number; bad: number }>;
    const counted = new Map(stored.map((s) => [Number(s.minute), s.count + s.bad]));
    const incomplete = foldMinutes(raw).filter(
      (m) => counted.get(m.minute) !== m.count + m.badCount,
    );
    await writeAggregates(tx, reservoirId, channel, incomplete, 'replace');
    for (const m of incomplete) await rollUpHours(tx, reservoirId, channel, m.minute, m.minute + 1);
    await tx.query(
      `DELETE FROM "readings" WHERE "reservoir_id" = ? AND "channel" = ? AND "time" >= ? AND "time" < ?`,
      [reservoirId, channel, start, end],
    );
    return raw.length;
  }
}
