import Database from 'better-sqlite3';
import type { SeriesPoint } from '@stillwell/shared/telemetry';

/** One stored reading as the CSV carries it. */
export interface RawReadingRow {
  channel: string;
  device_id: string;
  seq: number;
  time: number;
  value: number;
  quality: string;
  received_at: number;
}

export interface ChannelPoints {
  /** readings not marked bad, oldest first */
  points: SeriesPoint[];
  suspect: number;
  bad: number;
}

/**
 * Reads the readings of a window through a read-only connection of its own: it sees only what is
 * committed, never blocks the one writer, and may hold a statement open across awaits while a
 * CSV streams. Windows are half-open, [from, to). Readings of a window are never changed here.
 */
export class ReadingsSource {
  private readonly db: Database.Database;
  private readonly own: boolean;

  /** `path` of the SQLite file; `shared` is used instead for an in-memory database. */
  constructor(path: string, shared?: Database.Database) {
    this.own = path !== ':memory:' || !shared;
    this.db = this.own ? new Database(path, { readonly: true, fileMustExist: true }) : shared!;
  }

  close(): void {
    if (this.own) this.db.close();
  }

  /** Readings of every channel in the window (the covering index answers it). */
  count(reservoirId: string, channels: readonly string[], from: number, to: number): number {
    const stmt = this.db.prepare(
      `SELECT COUNT(*) AS n FROM readings WHERE reservoir_id = ? AND channel = ? AND time >= ? AND time < ?`,
    );
    let n = 0;
    for (const c of channels) n += (stmt.get(reservoirId, c, from, to) as { n: number }).n;
    return n;
  }

  /** The first and last reading time of a channel (index seeks), null when it has none. */
  span(reservoirId: string, channel: string): { first: number; last: number } | null {
    const row = this.db
      .prepare(
        `SELECT MIN(time) AS first, MAX(time) AS last FROM readings WHERE reservoir_id = ? AND channel = ?`,
      )
      .get(reservoirId, channel) as { first: number | null; last: number | null };
    return row.first === null || row.last === null ? null : { first: row.first, last: row.last };
  }

  /** The channels that have readings of this reservoir, found by seeking the index. */
  channels(reservoirId: string): string[] {
    const next = this.db.prepare(
      `SELECT channel FROM readings WHERE reservoir_id = ? AND channel > ? ORDER BY channel LIMIT 1`,
    );
    const out: string[] = [];
    let last = '';
    for (;;) {
      const row = next.get(reservoirId, last) as { channel: string } | undefined;
      if (!row) return out;
      out.push(row.channel);
      last = row.channel;
    }
  }

  /** One channel's readings not marked bad, oldest first, with the suspect and bad counts. */
  points(reservoirId: string, channel: string, from: number, to: number): ChannelPoints {
    const stmt = this.db
      .prepare(
        `SELECT time, value, quality FROM readings
         WHERE reservoir_id = ? AND channel = ? AND time >= ? AND time < ? ORDER BY time, id`,
      )
      .raw(true);
    const points: SeriesPoint[] = [];
    let suspect = 0;
    let bad = 0;
    for (const row of stmt.iterate(reservoirId, channel, from, to) as IterableIterator<
      [number, number, string]
    >) {
      const [t, v, q] = row;
      if (q === 'bad') {
        bad += 1;
        continue;
      }
      if (q === 'suspect') suspect += 1;
      points.push({ t, v });
    }
    return { points, suspect, bad };
  }

  /** Every reading of a channel in the window, oldest first, lazily (for the CSV). */
  rows(
    reservoirId: string,
    channel: string,
    from: number,
    to: number,
  ): IterableIterator<RawReadingRow> {
    return this.db
      .prepare(
        `SELECT channel, device_id, seq, time, value, quality, received_at FROM readings
         WHERE reservoir_id = ? AND channel = ? AND time >= ? AND time < ? ORDER BY time, id`,
      )
      .iterate(reservoirId, channel, from, to) as IterableIterator<RawReadingRow>;
  }
}
