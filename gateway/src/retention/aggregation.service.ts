import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { ConfigService } from '@nestjs/config';
import { DataSource } from 'typeorm';
import type { Env } from '../config';
import { WriteQueueService } from '../database/write-queue.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { firstReadingAfter, rawReadings, rollUpHours, writeAggregates } from './aggregate-sql';
import { floorMinute, foldMinutes } from './minute-aggregates';
import { RetentionMarksService } from './retention-marks.service';

/** One write job covers at most this much site time, so ingestion is never held up for long. */
export const CHUNK_MS = 3_600_000;

/**
 * The incremental aggregate job: folds closed minutes (ended at least AGGREGATE_GRACE_S of site
 * time ago) not yet aggregated into one-minute aggregates, and moves the reservoir's mark past
 * them in the same transaction. Running it again finds nothing new: idempotent.
 */
@Injectable()
export class AggregationService {
  private readonly graceMs: number;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly reservoirs: ReservoirsService,
    private readonly marks: RetentionMarksService,
    config: ConfigService<Env, true>,
  ) {
    this.graceMs = config.get('AGGREGATE_GRACE_S', { infer: true }) * 1000;
  }

  /** Aggregates what is closed at site time `nowMs`; returns the minutes written. */
  async aggregate(reservoirId: string, nowMs: number): Promise<number> {
    const channels = [...this.reservoirs.get(reservoirId).channels.keys()];
    const closedBefore = floorMinute(nowMs - this.graceMs);
    let written = 0;
    // one write job per chunk, so other writes interleave while a backlog catches up
    for (;;) {
      const done = await this.writes.run(() =>
        this.dataSource.transaction(async (tx) => {
          const marks = await this.marks.get(reservoirId, tx);
          const from = marks.aggregatedThrough ?? 0;
          if (from >= closedBefore) return null;
          // skip stretches without readings in one step
          const first = await firstReadingAfter(tx, reservoirId, channels, from);
          const start = first === null ? closedBefore : Math.max(from, floorMinute(first));
          const end = Math.min(start + CHUNK_MS, closedBefore);
          let minutes = 0;
          if (start < end) {
            for (const channel of channels) {
              const folded = foldMinutes(await rawReadings(tx, reservoirId, channel, start, end));
              await writeAggregates(tx, reservoirId, channel, folded, 'keep');
              if (folded.length) await rollUpHours(tx, reservoirId, channel, start, end);
              minutes += folded.length;
            }
          }
          await this.marks.set(tx, reservoirId, {
            ...marks,
            aggregatedThrough: Math.max(end, from),
          });
          return { minutes, caughtUp: end >= closedBefore };
        }),
      );
      if (!done) break;
      written += done.minutes;
      if (done.caughtUp) break;
    }
    return written;
  }
}
