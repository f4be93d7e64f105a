import { createHash } from 'node:crypto';
import Database from 'better-sqlite3';

/** Tables that scheduled jobs write on their own clock, whatever the requests: not compared. */
export const BACKGROUND_TABLES = ['retention_marks', 'reading_aggregates'];

/** Count and SHA-256 of every row of every table: the state a refused request must not touch. */
export function snapshot(file: string, ignore = BACKGROUND_TABLES): Record<string, string> {
  const db = new Database(file, { readonly: true });
  try {
    const tables = db
      .prepare(
        `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name`,
      )
      .all() as Array<{ name: string }>;
    return Object.fromEntries(
      tables
        .filter(({ name }) => !ignore.includes(name))
        .map(({ name }) => {
          const rows = db.prepare(`SELECT * FROM "${name}" ORDER BY rowid`).all();
          const hash = createHash('sha256').update(JSON.stringify(rows)).digest('hex');
          return [name, `${rows.length} rows ${hash.slice(0, 16)}`];
        }),
    );
  } finally {
    db.close();
  }
}
