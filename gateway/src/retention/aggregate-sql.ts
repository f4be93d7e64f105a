import {
  floorHour,
  foldHours,
  HOUR_MS,
  type MinuteAggregate,
  type RawReading,
} from './minute-aggregates';

/** What the SQL helpers need of a connection: TypeORM's DataSource, EntityManager, or a bare adapter. */
export interface Queryable {
  query(sql: string, params?: unknown[]): Promise<unknown>;
}

/** minute: reading_aggregates; hour: reading_hour_aggregates (same columns, hour for minute) */
export type AggregateLevel = 'minute' | 'hour';
const TABLE: Record<AggregateLevel, string> = {
  minute: 'reading_aggregates',
  hour: 'reading_hour_aggregates',
};

const COLUMNS = [
  'reservoir_id',
  'channel',
  'minute',
  'count',
  'min',
  'min_time',
  'max',
  'max_time',
  'mean',
  'suspect_count',
  'bad_count',
  'first_received_at',
];
const ROWS_PER_STATEMENT = 500;

/** One channel's raw readings in [fromMs, toMs), oldest first (the channel-time index serves it). */
export async function rawReadings(
  db: Queryable,
  reservoirId: string,
  channel: string,
  fromMs: number,
  toMs: number,
): Promise<RawReading[]> {
  return (await db.query(
    `SELECT "time", "value", "quality", "received_at" FROM "readings"
     WHERE "reservoir_id" = ? AND "channel" = ? AND "time" >= ? AND "time" < ? ORDER BY "time"`,
    [reservoirId, channel, fromMs, toMs],
  )) as RawReading[];
}

/**
 * Writes minute aggregates. `keep` leaves a minute already there untouched (the incremental job:
 * running it twice changes nothing); `replace` overwrites it (a minute recomputed from raw).
 */
export async function writeAggregates(
  db: Queryable,
  reservoirId: string,
  channel: string,
  minutes: readonly MinuteAggregate[],
  onConflict: 'keep' | 'replace',
  level: AggregateLevel = 'minute',
): Promise<void> {
  const columns = COLUMNS.map((c) => (c === 'minute' ? level : c));
  const update = COLUMNS.slice(3)
    .map((c) => `"${c}" = excluded."${c}"`)
    .join(', ');
  const action = onConflict === 'keep' ? 'DO NOTHING' : `DO UPDATE SET ${update}`;
  for (let i = 0; i < minutes.length; i += ROWS_PER_STATEMENT) {
    const part = minutes.slice(i, i + ROWS_PER_STATEMENT);
    const values = part.map(() => `(${COLUMNS.map(() => '?').join(', ')})`).join(', ');
    const params = part.flatMap((m) => [
      reservoirId,
      channel,
      m.minute,
      m.count,
      m.min,
      m.minTime,
      m.max,
      m.maxTime,
      m.mean,
      m.suspectCount,
      m.badCount,
      m.firstReceivedAt,
    ]);
    await db.query(
      `INSERT INTO "${TABLE[level]}" (${columns.map((c) => `"${c}"`).join(', ')})
       VALUES ${values} ON CONFLICT ("reservoir_id", "channel", "${level}") ${action}`,
      params,
    );
  }
}

/** The first raw reading at or after `fromMs` over the channels, or null. */
export async function firstReadingAfter(
  db: Queryable,
  reservoirId: string,
  channels: readonly string[],
  fromMs: number,
): Promise<number | null> {
  let first: number | null = null;
  for (const channel of channels) {
    const [row] = (await db.query(
      `SELECT MIN("time") AS "t" FROM "readings"
       WHERE "reservoir_id" = ? AND "channel" = ? AND "time" >= ?`,
      [reservoirId, channel, fromMs],
    )) as Array<{ t: number | null }>;
    if (row?.t !== null && row?.t !== undefined && (first === null || row.t < first)) first = row.t;
  }
  return first;
}

/** One channel's minute aggregates in [fromMs, toMs), oldest first. */
export async function minuteAggregates(
  db: Queryable,
  reservoirId: string,
  channel: string,
  fromMs: number,
  toMs: number,
): Promise<MinuteAggregate[]> {
  const rows = (await db.query(
    `SELECT "minute", "count", "min", "min_time" AS "minTime", "max", "max_time" AS "maxTime",
            "mean", "suspect_count" AS "suspectCount", "bad_count" AS "badCount",
            "first_received_at" AS "firstReceivedAt"
     FROM "reading_aggregates"
     WHERE "reservoir_id" = ? AND "channel" = ? AND "minute" >= ? AND "minute" < ? ORDER BY "minute"`,
    [reservoirId, channel, fromMs, toMs],
  )) as MinuteAggregate[];
  return rows.map((r) => ({
    ...r,
    minute: Number(r.minute),
    minTime: r.minTime === null ? null : Number(r.minTime),
    maxTime: r.maxTime === null ? null : Number(r.maxTime),
    firstReceivedAt: Number(r.firstReceivedAt),
  }));
}

/** Recomputes the hour roll-ups of every hour that [fromMs, toMs) touches, from its minutes. */
export async function rollUpHours(
  db: Queryable,
  reservoirId: string,
  channel: string,
  fromMs: number,
  toMs: number,
): Promise<void> {
  const start = floorHour(fromMs);
  const end = floorHour(toMs - 1) + HOUR_MS;
  const minutes = await minuteAggregates(db, reservoirId, channel, start, end);
  await writeAggregates(db, reservoirId, channel, foldHours(minutes), 'replace', 'hour');
}
