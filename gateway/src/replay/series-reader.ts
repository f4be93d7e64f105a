import { downsampleMinMax, type Quality, type SeriesPoint } from '@stillwell/shared/telemetry';
import type { ReplayResolution } from '@stillwell/shared/replay';
import type { Queryable } from '../retention/aggregate-sql';
import { floorHour, floorMinute, HOUR_MS } from '../retention/minute-aggregates';

interface Point extends SeriesPoint {
  q: Quality;
}

export interface SeriesRequest {
  reservoirId: string;
  channel: string;
  fromMs: number;
  toMs: number;
  buckets: number;
  resolution: ReplayResolution;
  /** minutes before this have aggregates (null: none yet) */
  aggregatedThroughMs: number | null;
}

export interface SeriesColumns {
  t: number[];
  v: number[];
  q: Quality[];
  sourcePoints: number;
}

async function rawPoints(db: Queryable, r: SeriesRequest, fromMs: number): Promise<Point[]> {
  // bad readings are not measurements of the process: left out, never drawn as good
  const rows = (await db.query(
    `SELECT "time", "value", "quality" FROM "readings"
     WHERE "reservoir_id" = ? AND "channel" = ? AND "time" >= ? AND "time" <= ? AND "quality" <> 'bad'
     ORDER BY "time"`,
    [r.reservoirId, r.channel, fromMs, r.toMs],
  )) as Array<{ time: number; value: number; quality: Quality }>;
  return rows.map((x) => ({ t: Number(x.time), v: x.value, q: x.quality }));
}

/** Each aggregate in [fromMs, beforeMs) as its two extremes, at the times they were measured. */
async function aggregatePoints(
  db: Queryable,
  r: SeriesRequest,
  level: 'minute' | 'hour',
  fromMs: number,
  beforeMs: number,
): Promise<Point[]> {
  if (beforeMs <= fromMs) return [];
  const table = level === 'minute' ? 'reading_aggregates' : 'reading_hour_aggregates';
  const rows = (await db.query(
    `SELECT "min", "min_time" AS "mint", "max", "max_time" AS "maxt", "suspect_count" AS "s"
     FROM "${table}"
     WHERE "reservoir_id" = ? AND "channel" = ? AND "${level}" >= ? AND "${level}" < ? AND "count" > 0
     ORDER BY "${level}"`,
    [r.reservoirId, r.channel, fromMs, beforeMs],
  )) as Array<{ min: number; mint: number; max: number; maxt: number; s: number }>;
  const out: Point[] = [];
  for (const m of rows) {
    const q: Quality = m.s > 0 ? 'suspect' : 'good';
    const lo = { t: Number(m.mint), v: m.min, q };
    const hi = { t: Number(m.maxt), v: m.max, q };
    const pair = lo.t === hi.t ? [lo] : lo.t < hi.t ? [lo, hi] : [hi, lo];
    for (const p of pair) if (p.t >= r.fromMs && p.t <= r.toMs) out.push(p);
  }
  return out;
}

const ceilTo = (ms: number, step: number) => Math.ceil(ms / step) * step;

/**
 * The window in tiers, oldest first: hourly roll-ups for whole hours inside it (hour resolution),
 * minute aggregates around them up to the aggregate mark, raw readings after the mark.
 */
async function tieredPoints(db: Queryable, r: SeriesRequest, mark: number): Promise<Point[]> {
  const minuteFrom = floorMinute(r.fromMs);
  const split = Math.min(Math.max(mark, r.fromMs), r.toMs + 1);
  const tail = await rawPoints(db, r, split);
  if (r.resolution !== 'hour')
    return [...(await aggregatePoints(db, r, 'minute', minuteFrom, split)), ...tail];
  const hourFrom = Math.min(ceilTo(r.fromMs, HOUR_MS), split);
  const hourTo = Math.max(hourFrom, Math.min(floorHour(r.toMs + 1), floorHour(split)));
  return [
    ...(await aggregatePoints(db, r, 'minute', minuteFrom, hourFrom)),
    ...(await aggregatePoints(db, r, 'hour', hourFrom, hourTo)),
    ...(await aggregatePoints(db, r, 'minute', hourTo, split)),
    ...tail,
  ];
}

/**
 * One channel over the window, downsampled to at most 2 x buckets points with each bucket's
 * minimum and maximum kept (downsampleMinMax). Aggregated stretches come from the aggregates,
 * the minutes not yet aggregated from raw readings.
 */
export async function readSeries(db: Queryable, r: SeriesRequest): Promise<SeriesColumns> {
  const points =
    r.resolution === 'raw' || r.aggregatedThroughMs === null
      ? await rawPoints(db, r, r.fromMs)
      : await tieredPoints(db, r, r.aggregatedThroughMs);
  const kept = downsampleMinMax(points, r.buckets, r.fromMs, r.toMs) as Point[];
  return {
    t: kept.map((p) => p.t),
    v: kept.map((p) => p.v),
    q: kept.map((p) => p.q),
    sourcePoints: points.length,
  };
}
