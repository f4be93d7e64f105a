/** One point of a time series: time in epoch milliseconds, value in SI units. */
export interface SeriesPoint {
  t: number;
  v: number;
}

/**
 * Min-max bucket downsampling: the span is cut into `buckets` equal time buckets and each keeps
 * its minimum and its maximum, in time order. A peak is therefore never lost (an averaging or
 * decimating reducer can drop it), and the output never exceeds 2 x buckets points.
 * Input must be sorted by time; a bucket with one point keeps it once.
 */
export function downsampleMinMax(
  points: readonly SeriesPoint[],
  buckets: number,
  from = points[0]?.t ?? 0,
  to = points[points.length - 1]?.t ?? 0,
): SeriesPoint[] {
  if (!Number.isInteger(buckets) || buckets < 1) {
    throw new RangeError(`buckets must be a positive integer, got ${buckets}`);
  }
  if (points.length <= 2 * buckets) return points.slice();
  const width = Math.max((to - from) / buckets, Number.MIN_VALUE);
  const out: SeriesPoint[] = [];
  let bucket = -1;
  let lo: SeriesPoint | undefined;
  let hi: SeriesPoint | undefined;
  const flush = () => {
    if (!lo || !hi) return;
    if (lo === hi) out.push(lo);
    else if (lo.t <= hi.t) out.push(lo, hi);
    else out.push(hi, lo);
  };
  for (const p of points) {
    const b = Math.min(buckets - 1, Math.max(0, Math.floor((p.t - from) / width)));
    if (b !== bucket) {
      flush();
      bucket = b;
      lo = p;
      hi = p;
      continue;
    }
    if (p.v < lo!.v) lo = p;
    if (p.v > hi!.v) hi = p;
  }
  flush();
  return out;
}
