/** A linear map from data to pixels, with round ticks. */
export interface Scale {
  (v: number): number;
  domain: readonly [number, number];
  ticks: number[];
}

function niceStep(span: number, count: number): number {
  const raw = span / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const norm = raw / mag;
  return (norm <= 1 ? 1 : norm <= 2 ? 2 : norm <= 5 ? 5 : 10) * mag;
}

export function linearScale(
  values: readonly number[],
  range: readonly [number, number],
  tickCount = 5,
): Scale {
  const finite = values.filter(Number.isFinite);
  let lo = finite.length ? Math.min(...finite) : 0;
  let hi = finite.length ? Math.max(...finite) : 1;
  if (hi - lo < 1e-9) {
    const pad = Math.abs(hi) * 0.01 || 1;
    lo -= pad;
    hi += pad;
  }
  const step = niceStep(hi - lo, tickCount);
  lo = Math.floor(lo / step) * step;
  hi = Math.ceil(hi / step) * step;
  const [r0, r1] = range;
  const f = ((v: number) => r0 + ((v - lo) / (hi - lo)) * (r1 - r0)) as Scale;
  f.domain = [lo, hi];
  const ticks: number[] = [];
  for (let v = lo; v <= hi + step / 2; v += step) ticks.push(Number(v.toPrecision(12)));
  f.ticks = ticks;
  return f;
}

/**
 * How old a point is, 0 (oldest in view) to 1 (newest): points are shaded by it, so the present
 * behaviour stands out against the history behind it.
 */
export function recency(t: number, from: number, to: number): number {
  if (!(to > from)) return 1;
  return Math.min(1, Math.max(0, (t - from) / (to - from)));
}
