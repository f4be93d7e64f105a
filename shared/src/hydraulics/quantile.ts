/**
 * Sample quantile of sorted values, Hyndman and Fan (1996) definition 7 (the default of R and
 * NumPy): linear interpolation between order statistics at position (n - 1) p.
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const pos = (n - 1) * Math.min(1, Math.max(0, p));
  const lo = Math.floor(pos);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo]! + (pos - lo) * (sorted[hi]! - sorted[lo]!);
}

/** Quantiles of unsorted values (copies and sorts). */
export function quantiles(values: ArrayLike<number>, ps: readonly number[]): number[] {
  const s = Float64Array.from(values).sort();
  return ps.map((p) => quantileSorted(s, p));
}
