import {
  LagFilter,
  baselineFlow,
  baselineLimit,
  weirFlow,
  type PiezometerSeries,
  type WeirSeries,
} from '@stillwell/shared/alarms';
import type { Piezometer, SeepageWeir } from '@stillwell/shared/reservoirs';

export interface Points {
  t: number[];
  v: number[];
}

/** a reading further than this from any pool reading has no pool beside it */
const POOL_GAP_MS = 30 * 60_000;
/** the baseline curve on the scatter: this many points across the pool range */
const CURVE_POINTS = 41;
/** at most this many points of each series go to the screen */
export const MAX_POINTS = 3000;

/** The pool at a time, linear between readings; null in a hole of the record. */
export function poolAt(pool: Points, t: number, from = { i: 0 }): number | null {
  const { t: ts, v } = pool;
  while (from.i + 1 < ts.length && ts[from.i + 1]! <= t) from.i++;
  const i = from.i;
  if (!ts.length) return null;
  const a = ts[i]!;
  if (t < a) return a - t <= POOL_GAP_MS ? v[i]! : null;
  const b = ts[i + 1];
  if (b === undefined) return t - a <= POOL_GAP_MS ? v[i]! : null;
  if (b - a > 2 * POOL_GAP_MS)
    return t - a <= POOL_GAP_MS ? v[i]! : b - t <= POOL_GAP_MS ? v[i + 1]! : null;
  return v[i]! + ((v[i + 1]! - v[i]!) * (t - a)) / (b - a);
}

/** The pool lagged by a first-order filter, evaluated at the instrument's times (sorted). */
export function laggedPool(
  pool: Points,
  lagHours: number,
  times: readonly number[],
): Array<number | null> {
  const f = new LagFilter(lagHours * 3_600_000);
  const out: Array<number | null> = [];
  let k = 0;
  for (const t of times) {
    for (; k < pool.t.length && pool.t[k]! <= t; k++) f.update(pool.t[k]!, pool.v[k]!);
    out.push(f.warm(t) ? f.value : null);
  }
  return out;
}

/** Keeps every k-th point so a long range stays drawable (the newest is always kept). */
export function thin(p: Points, max = MAX_POINTS): Points {
  if (p.t.length <= max) return p;
  const step = Math.ceil(p.t.length / max);
  const keep = (_: number, i: number) => (p.t.length - 1 - i) % step === 0;
  return { t: p.t.filter(keep), v: p.v.filter(keep) };
}

function poolRange(pool: Points, fallback: [number, number]): [number, number] {
  if (!pool.v.length) return fallback;
  return [Math.min(...pool.v) - 1, Math.max(...pool.v) + 1];
}

export function weirSeries(
  w: SeepageWeir,
  readings: Points,
  pool: Points,
  fromMs: number,
): WeirSeries {
  const lagged = laggedPool(pool, w.baseline.lagHours, readings.t);
  const cursor = { i: 0 };
  const inRange = readings.t.map((t) => t >= fromMs);
  const pick = <T>(xs: T[]) => xs.filter((_, i) => inRange[i]);
  const [lo, hi] = poolRange(pool, [w.baseline.zeroFlowPool, w.baseline.referencePool + 5]);
  return {
    weir: w,
    t: pick(readings.t),
    head: pick(readings.v),
    flow: pick(readings.v.map((h) => weirFlow(w, h))),
    pool: pick(readings.t.map((t) => poolAt(pool, t, cursor))),
    baseline: pick(lagged.map((p) => (p === null ? null : baselineFlow(w, p)))),
    limit: pick(lagged.map((p) => (p === null ? null : baselineLimit(w, p)))),
    curve: Array.from({ length: CURVE_POINTS }, (_, i) => {
      const z = lo + ((hi - lo) * i) / (CURVE_POINTS - 1);
      return { pool: z, flow: baselineFlow(w, z) };
    }),
  };
}

export function piezometerSeries(
  p: Piezometer,
  readings: Points,
  pool: Points,
  fromMs: number,
): PiezometerSeries {
  const b = p.baseline;
  const steady = (z: number) => b.downstreamLevel + b.ratio * (z - b.downstreamLevel);
  const lagged = laggedPool(pool, b.lagHours, readings.t);
  const cursor = { i: 0 };
  const inRange = readings.t.map((t) => t >= fromMs);
  const pick = <T>(xs: T[]) => xs.filter((_, i) => inRange[i]);
  const [lo, hi] = poolRange(pool, [b.downstreamLevel, b.downstreamLevel + 40]);
  return {
    piezometer: p,
    t: pick(readings.t),
    level: pick(readings.v),
    pool: pick(readings.t.map((t) => poolAt(pool, t, cursor))),
    baseline: pick(lagged.map((z) => (z === null ? null : steady(z)))),
    curve: Array.from({ length: CURVE_POINTS }, (_, i) => {
      const z = lo + ((hi - lo) * i) / (CURVE_POINTS - 1);
      return { pool: z, level: steady(z) };
    }),
  };
}
