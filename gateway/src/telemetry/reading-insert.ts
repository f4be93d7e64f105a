import type { Driver, QueryRunner } from 'typeorm';
import type { Reading } from './reading.entity';

const COLUMNS = [
  'reservoir_id',
  'device_id',
  'channel',
  'seq',
  'time',
  'value',
  'quality',
  'received_at',
] as const;
/** Rows per statement: 8 parameters each, far below SQLite's and PostgreSQL's parameter limits. */
export const ROWS_PER_STATEMENT = 1000;

export type NewReading = Omit<Reading, 'id'>;

/**
 * The ingestion hot path. TypeORM's query builder spends more time assembling a 1,000-row INSERT
 * than SQLite spends running it, so the statement text is built once per row count, with the
 * driver's own placeholders, and run through TypeORM's query runner. ON CONFLICT DO NOTHING works on
 * SQLite and PostgreSQL alike and makes a repeated delivery harmless.
 */
export class ReadingInserter {
  private readonly statements = new Map<number, string>();

  constructor(private readonly driver: Driver) {}

  /** Inserts the rows; resolves to how many were new. */
  async insert(runner: QueryRunner, rows: readonly NewReading[]): Promise<number> {
    let inserted = 0;
    for (let i = 0; i < rows.length; i += ROWS_PER_STATEMENT) {
      const chunk = rows.slice(i, i + ROWS_PER_STATEMENT);
      const params: Array<string | number> = [];
      for (const r of chunk) {
        params.push(
          r.reservoirId,
          r.deviceId,
          r.channel,
          r.seq,
          r.time,
          r.value,
          r.quality,
          r.receivedAt,
        );
      }
      const result = (await runner.query(this.statement(chunk.length), params, true)) as {
        affected?: number;
      };
      inserted += result.affected ?? 0;
    }
    return inserted;
  }

  private statement(rows: number): string {
    let sql = this.statements.get(rows);
    if (!sql) {
      let n = 0;
      const tuples = Array.from(
        { length: rows },
        () => `(${COLUMNS.map(() => this.driver.createParameter(`p${n}`, n++)).join(', ')})`,
      );
      sql = `INSERT INTO "readings" (${COLUMNS.map((c) => `"${c}"`).join(', ')}) VALUES ${tuples.join(', ')} ON CONFLICT DO NOTHING`;
      this.statements.set(rows, sql);
    }
    return sql;
  }
}
