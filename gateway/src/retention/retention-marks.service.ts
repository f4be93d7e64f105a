import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { Queryable } from './aggregate-sql';

export interface RetentionMarks {
  /** every minute before this is aggregated (null: nothing yet) */
  aggregatedThrough: number | null;
  /** raw readings before this are gone (0: none pruned) */
  prunedThrough: number;
}

/** Reads and moves the per-reservoir marks of the aggregate and prune jobs. */
@Injectable()
export class RetentionMarksService {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  async get(reservoirId: string, db: Queryable = this.dataSource): Promise<RetentionMarks> {
    const [row] = (await db.query(
      `SELECT "aggregated_through" AS "a", "pruned_through" AS "p" FROM "retention_marks"
       WHERE "reservoir_id" = ?`,
      [reservoirId],
    )) as Array<{ a: number; p: number }>;
    return row
      ? { aggregatedThrough: Number(row.a), prunedThrough: Number(row.p) }
      : { aggregatedThrough: null, prunedThrough: 0 };
  }

  async set(db: Queryable, reservoirId: string, marks: RetentionMarks): Promise<void> {
    await db.query(
      `INSERT INTO "retention_marks" ("reservoir_id", "aggregated_through", "pruned_through")
       VALUES (?, ?, ?) ON CONFLICT ("reservoir_id")
       DO UPDATE SET "aggregated_through" = excluded."aggregated_through",
                     "pruned_through" = excluded."pruned_through"`,
      [reservoirId, marks.aggregatedThrough ?? 0, marks.prunedThrough],
    );
  }
}
