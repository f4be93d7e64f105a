/**
 * A flow series: times (s, strictly increasing) and flows (m3/s), linear between points and held
 * at the end values outside them.
 */
export interface FlowSeries {
  readonly t: ArrayLike<number>;
  readonly q: ArrayLike<number>;
}

/** One observation or forecast point. */
export interface FlowPoint {
  t: number;
  q: number;
}

export function seriesFromPoints(points: readonly FlowPoint[]): FlowSeries {
  return { t: Float64Array.from(points, (p) => p.t), q: Float64Array.from(points, (p) => p.q) };
}

/** Problems with a series as messages (points counted from 1). */
export function validateSeries(s: FlowSeries, what = 'inflow'): string[] {
  const out: string[] = [];
  if (s.t.length !== s.q.length) out.push(`${what}: ${s.t.length} times but ${s.q.length} flows`);
  if (s.t.length < 1) out.push(`${what}: no points`);
  for (let i = 0; i < s.t.length; i++) {
    if (!Number.isFinite(s.t[i]!)) out.push(`${what} point ${i + 1}: time is not a finite number`);
    if (!Number.isFinite(s.q[i]!) || s.q[i]! < 0)
      out.push(`${what} point ${i + 1}: flow must be a finite number >= 0`);
    if (i > 0 && !(s.t[i]! > s.t[i - 1]!))
      out.push(`${what} point ${i + 1}: time must be after point ${i}`);
  }
  return out;
}

export function assertSeries(s: FlowSeries, what = 'inflow'): void {
  const p = validateSeries(s, what);
  if (p.length > 0)
    throw new RangeError(
      p.slice(0, 5).join('; ') + (p.length > 5 ? ` (+${p.length - 5} more)` : ''),
    );
}

function indexBefore(t: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = t.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid]! <= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Flow at time x. */
export function seriesAt(s: FlowSeries, x: number): number {
  const n = s.t.length;
  if (x <= s.t[0]!) return s.q[0]!;
  if (x >= s.t[n - 1]!) return s.q[n - 1]!;
  const i = indexBefore(s.t, x);
  const t0 = s.t[i]!;
  return s.q[i]! + ((s.q[i + 1]! - s.q[i]!) * (x - t0)) / (s.t[i + 1]! - t0);
}

/** Exact integral of the series from a to b (a <= b), m3. */
export function seriesIntegral(s: FlowSeries, a: number, b: number): number {
  if (!(b > a)) return 0;
  const n = s.t.length;
  // knots strictly inside (a, b), plus the ends: the series is linear between consecutive ones
  let total = 0;
  let x0 = a;
  let q0 = seriesAt(s, a);
  let i = x0 >= s.t[n - 1]! ? n : x0 < s.t[0]! ? 0 : indexBefore(s.t, x0) + 1;
  for (; i < n && s.t[i]! < b; i++) {
    const x1 = s.t[i]!;
    if (x1 <= x0) continue;
    const q1 = s.q[i]!;
    total += 0.5 * (q0 + q1) * (x1 - x0);
    x0 = x1;
    q0 = q1;
  }
  total += 0.5 * (q0 + seriesAt(s, b)) * (b - x0);
  return total;
}

/** The series sampled at t0 + k dt for k = 0..steps (one merge pass over the knots). */
export function sampleSeries(s: FlowSeries, t0: number, dt: number, steps: number): Float64Array {
  const out = new Float64Array(steps + 1);
  const ts = s.t;
  const qs = s.q;
  const n = ts.length;
  const first = ts[0]!;
  const last = ts[n - 1]!;
  let i = 0;
  for (let k = 0; k <= steps; k++) {
    const x = t0 + k * dt;
    if (x <= first) out[k] = qs[0]!;
    else if (x >= last) out[k] = qs[n - 1]!;
    else {
      while (ts[i + 1]! <= x) i++;
      const ta = ts[i]!;
      out[k] = qs[i]! + ((qs[i + 1]! - qs[i]!) * (x - ta)) / (ts[i + 1]! - ta);
    }
  }
  return out;
}

/** The series' knot times strictly inside (a, b). */
export function seriesKnotsWithin(s: FlowSeries, a: number, b: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < s.t.length; i++) if (s.t[i]! > a && s.t[i]! < b) out.push(s.t[i]!);
  return out;
}
