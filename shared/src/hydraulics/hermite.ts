/**
 * Monotone piecewise cubic Hermite interpolation on flat typed arrays (no allocation per call).
 *
 * Knots x must be strictly increasing and values y non-decreasing. Node slopes either come from the
 * data (PCHIP, Fritsch and Butland's harmonic mean as in Moler, "Numerical Computing with MATLAB",
 * 2004, sec. 3.4) or are supplied (for example the tabulated surface area as dS/dh) and then limited
 * by the Fritsch-Carlson condition (Fritsch and Carlson, SIAM J. Numer. Anal. 17(2), 1980): with
 * alpha = d_i / delta and beta = d_{i+1} / delta, the cubic on a segment is monotone when
 * alpha^2 + beta^2 <= 9. Slopes outside that circle are scaled back onto it.
 */

/** Node slopes for a monotone interpolant of (x, y): PCHIP (Fritsch-Butland). */
export function pchipSlopes(x: Float64Array, y: Float64Array): Float64Array {
  const n = x.length;
  const d = new Float64Array(n);
  if (n < 2) return d;
  const h = (i: number) => x[i + 1]! - x[i]!;
  const del = (i: number) => (y[i + 1]! - y[i]!) / h(i);
  if (n === 2) {
    d[0] = d[1] = del(0);
    return d;
  }
  for (let k = 1; k < n - 1; k++) {
    const d0 = del(k - 1);
    const d1 = del(k);
    if (d0 <= 0 || d1 <= 0) {
      d[k] = 0;
    } else {
      const w1 = 2 * h(k) + h(k - 1);
      const w2 = h(k) + 2 * h(k - 1);
      d[k] = (w1 + w2) / (w1 / d0 + w2 / d1);
    }
  }
  d[0] = endSlope(h(0), h(1), del(0), del(1));
  d[n - 1] = endSlope(h(n - 2), h(n - 3), del(n - 2), del(n - 3));
  return d;
}

/** Non-centred three-point end slope, shape-preserving (Moler's pchipend). */
function endSlope(h0: number, h1: number, del0: number, del1: number): number {
  let d = ((2 * h0 + h1) * del0 - h0 * del1) / (h0 + h1);
  if (Math.sign(d) !== Math.sign(del0)) d = 0;
  else if (Math.sign(del0) !== Math.sign(del1) && Math.abs(d) > Math.abs(3 * del0)) d = 3 * del0;
  return d;
}

/**
 * Limits supplied node slopes so that each cubic segment is monotone. Returns the number of nodes
 * whose slope had to be changed (0 when the supplied slopes are consistent with the values).
 */
export function limitSlopes(x: Float64Array, y: Float64Array, d: Float64Array): number {
  let changed = 0;
  const original = Float64Array.from(d);
  for (let i = 0; i < d.length; i++) if (!(d[i]! >= 0)) d[i] = 0;
  for (let i = 0; i + 1 < x.length; i++) {
    const delta = (y[i + 1]! - y[i]!) / (x[i + 1]! - x[i]!);
    if (delta <= 0) {
      d[i] = 0;
      d[i + 1] = 0;
      continue;
    }
    // alpha^2 + beta^2 > 9 <=> hypot(d_i, d_i+1) > 3 delta; scale onto the circle without overflow
    const r = Math.hypot(d[i]!, d[i + 1]!);
    if (r > 3 * delta) {
      const k = (3 * delta) / r;
      d[i] = k * d[i]!;
      d[i + 1] = k * d[i + 1]!;
    }
  }
  for (let i = 0; i < d.length; i++) {
    if (Math.abs(d[i]! - original[i]!) > 1e-12 * Math.max(1, Math.abs(original[i]!))) changed++;
  }
  return changed;
}

/** Index i of the segment [x_i, x_{i+1}] holding v (clamped to the first/last segment). */
export function segmentOf(x: Float64Array, v: number): number {
  let lo = 0;
  let hi = x.length - 1;
  if (v <= x[0]!) return 0;
  if (v >= x[hi]!) return hi - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid]! <= v) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Value of the Hermite interpolant at v on segment i. */
export function hermiteValue(
  x: Float64Array,
  y: Float64Array,
  d: Float64Array,
  i: number,
  v: number,
): number {
  const x0 = x[i]!;
  const h = x[i + 1]! - x0;
  const t = (v - x0) / h;
  const t2 = t * t;
  const t3 = t2 * t;
  const ya = y[i]!;
  const yb = y[i + 1]!;
  const v1 =
    (2 * t3 - 3 * t2 + 1) * ya +
    (t3 - 2 * t2 + t) * h * d[i]! +
    (-2 * t3 + 3 * t2) * yb +
    (t3 - t2) * h * d[i + 1]!;
  // a monotone segment stays within its end values; clamp away rounding so monotonicity is exact
  return v1 < ya ? ya : v1 > yb ? yb : v1;
}

/** Derivative of the Hermite interpolant at v on segment i. */
export function hermiteSlope(
  x: Float64Array,
  y: Float64Array,
  d: Float64Array,
  i: number,
  v: number,
): number {
  const x0 = x[i]!;
  const h = x[i + 1]! - x0;
  const t = (v - x0) / h;
  const t2 = t * t;
  return (
    ((6 * t2 - 6 * t) * (y[i]! - y[i + 1]!)) / h +
    (3 * t2 - 4 * t + 1) * d[i]! +
    (3 * t2 - 2 * t) * d[i + 1]!
  );
}

/**
 * Inverse of a monotone Hermite interpolant on segment i: the v in [x_i, x_{i+1}] with value w.
 * Newton's method from the secant guess, kept inside a shrinking bracket (bisection fallback).
 */
export function hermiteInverse(
  x: Float64Array,
  y: Float64Array,
  d: Float64Array,
  i: number,
  w: number,
): number {
  let lo = x[i]!;
  let hi = x[i + 1]!;
  const y0 = y[i]!;
  const y1 = y[i + 1]!;
  if (w <= y0) return lo;
  if (w >= y1) return hi;
  let v = lo + ((w - y0) / (y1 - y0)) * (hi - lo);
  const tol = 1e-13 * Math.max(1, Math.abs(hi));
  for (let k = 0; k < 60; k++) {
    const f = hermiteValue(x, y, d, i, v) - w;
    if (f > 0) hi = v;
    else lo = v;
    const s = hermiteSlope(x, y, d, i, v);
    let next = s > 0 ? v - f / s : NaN;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - v) <= tol || hi - lo <= tol) return next;
    v = next;
  }
  return v;
}

/** Segment of a non-decreasing array y holding w: the first i with y_{i+1} >= w. */
export function valueSegmentOf(y: Float64Array, w: number): number {
  let lo = 0;
  let hi = y.length - 1;
  if (w <= y[0]!) return 0;
  if (w >= y[hi]!) return hi - 1;
  // invariant: y[lo] < w <= y[hi]
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (y[mid]! < w) lo = mid;
    else hi = mid;
  }
  return lo;
}
