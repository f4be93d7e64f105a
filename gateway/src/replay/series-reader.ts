import { downsampleMinMax, type Quality, type SeriesPoint } from '@stillwell/shared/telemetry';
import type { ReplayResolution } from '@stillwell/shared/replay';
import type { Queryable } from '../retention/aggregate-sql';
import { floorMinute } from '../retention/minute-aggregates';

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

/** Each aggregated minute as its two extremes, at the times they were measured. */
async function minutePoints(db: Queryable, r: SeriesRequest, beforeMs: number): Promise<Point[]> {
  const rows = (await db.query(
    `SELECT "min", "min_time" AS "mint", "max", "max_time" AS "maxt", "suspect_count" AS "s"
     FROM "reading_aggregates"
     WHERE "reservoir_id" = ? AND "channel" = ? AND "minute" >= ? AND "minute" < ? AND "count" > 0
     ORDER BY "minute"`,
    [r.reservoirId, r.channel, floorMinute(r.fromMs), beforeMs],
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

/**
 * One channel over the window, downsampled to at most 2 x buckets points with each bucket's
 * minimum and maximum kept (downsampleMinMax). At minute resolution the aggregated minutes
 * come from the aggregates and the minutes not yet aggregated from raw readings.
 */
export async function readSeries(db: Queryable, r: SeriesRequest): Promise<SeriesColumns> {
  let points: Point[];
  if (r.resolution === 'raw' || r.aggregatedThroughMs === null) {
    points = await rawPoints(db, r, r.fromMs);
  } else {
    const split = Math.min(Math.max(r.aggregatedThroughMs, r.fromMs), r.toMs + 1);
    points = [...(await minutePoints(db, r, split)), ...(await rawPoints(db, r, split))];
  }
  const kept = downsampleMinMax(points, r.buckets, r.fromMs, r.toMs) as Point[];
  return {
    t: kept.map((p) => p.t),
    v: kept.map((p) => p.v),
    q: kept.map((p) => p.q),
    sourcePoints: points.length,
  };
}
