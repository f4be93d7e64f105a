import type { SeriesPoint } from '@stillwell/shared/telemetry';

/** The rate of rise is the least-squares slope over this much time, as the live status computes it. */
export const RISE_WINDOW_MS = 30 * 60 * 1000;
/** fewer readings than this in the span give no rate (as the live status) */
export const RISE_MIN_POINTS = 3;

/** The highest value and the time it was first reached; null for no points. */
export function peakOf(points: readonly SeriesPoint[]): SeriesPoint | null {
  let best: SeriesPoint | null = null;
  for (const p of points) if (!best || p.v > best.v) best = p;
  return best;
}

/**
 * The largest rate of rise, m/h: at each reading, the least-squares slope of the readings of the
 * preceding 30 minutes (t >= t_i - 30 min), kept when at least three readings are in the span.
 * Running sums keep it linear in the readings; times are taken relative to the first reading,
 * in hours, so that the sums stay far from the limits of double precision.
 */
export function maxRateOfRise(
  points: readonly SeriesPoint[],
  windowMs = RISE_WINDOW_MS,
  minPoints = RISE_MIN_POINTS,
): { value: number; t: number } | null {
  if (!points.length) return null;
  const t0 = points[0]!.t;
  const h = (p: SeriesPoint) => (p.t - t0) / 3_600_000;
  let best: { value: number; t: number } | null = null;
  let lo = 0;
  let n = 0;
  let st = 0;
  let sv = 0;
  let stt = 0;
  let stv = 0;
  for (let i = 0; i < points.length; i += 1) {
    const p = points[i]!;
    const x = h(p);
    n += 1;
    st += x;
    sv += p.v;
    stt += x * x;
    stv += x * p.v;
    while (points[lo]!.t < p.t - windowMs) {
      const q = points[lo]!;
      const y = h(q);
      n -= 1;
      st -= y;
      sv -= q.v;
      stt -= y * y;
      stv -= y * q.v;
      lo += 1;
    }
    if (n < minPoints) continue;
    const den = stt - (st * st) / n;
    // all readings of the span at one time: no slope
    if (den <= 1e-12) continue;
    const slope = (stv - (st * sv) / n) / den;
    if (!best || slope > best.value) best = { value: slope, t: p.t };
  }
  return best;
}
