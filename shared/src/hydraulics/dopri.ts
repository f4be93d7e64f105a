/**
 * Dormand-Prince 5(4) explicit Runge-Kutta with adaptive steps and 4th-order dense output
 * (Dormand and Prince, J. Comput. Appl. Math. 6, 1980; coefficients, error norm, step control and
 * continuous extension as in Hairer, Norsett and Wanner, Solving Ordinary Differential Equations I,
 * 2nd ed., 1993, sec. II.4-II.6, code DOPRI5).
 *
 * Integration restarts at each breakpoint (times where the right-hand side has a kink: inflow
 * knots, gate moves starting or stopping), so that no step straddles one.
 */
export type Rhs = (t: number, y: Float64Array, dydt: Float64Array) => void;

export interface DopriOptions {
  rtol?: number;
  atol?: number | Float64Array;
  /** largest step, s (default: the whole interval) */
  maxStep?: number;
  maxSteps?: number;
}

export interface DopriStats {
  accepted: number;
  rejected: number;
  evaluations: number;
}

const C2 = 1 / 5,
  C3 = 3 / 10,
  C4 = 4 / 5,
  C5 = 8 / 9;
const A21 = 1 / 5;
const A31 = 3 / 40,
  A32 = 9 / 40;
const A41 = 44 / 45,
  A42 = -56 / 15,
  A43 = 32 / 9;
const A51 = 19372 / 6561,
  A52 = -25360 / 2187,
  A53 = 64448 / 6561,
  A54 = -212 / 729;
const A61 = 9017 / 3168,
  A62 = -355 / 33,
  A63 = 46732 / 5247,
  A64 = 49 / 176,
  A65 = -5103 / 18656;
const A71 = 35 / 384,
  A73 = 500 / 1113,
  A74 = 125 / 192,
  A75 = -2187 / 6784,
  A76 = 11 / 84;
const E1 = 71 / 57600,
  E3 = -71 / 16695,
  E4 = 71 / 1920,
  E5 = -17253 / 339200,
  E6 = 22 / 525,
  E7 = -1 / 40;
const D1 = -12715105075 / 11282082432,
  D3 = 87487479700 / 32700410799,
  D4 = -10690763975 / 1880347072;
const D5 = 701980252875 / 199316789632,
  D6 = -1453857185 / 822651844,
  D7 = 69997945 / 29380423;

/**
 * Integrates y' = f(t, y) from tOut[0] with y0, writing the solution at every output time into
 * out[i * dim + j]. Breakpoints strictly inside the span end steps exactly there.
 */
export function dopri5(
  f: Rhs,
  y0: Float64Array,
  tOut: Float64Array,
  out: Float64Array,
  breakpoints: readonly number[] = [],
  options: DopriOptions = {},
): DopriStats {
  const dim = y0.length;
  const rtol = options.rtol ?? 1e-8;
  const atolOpt = options.atol ?? 1e-8;
  const atol = (j: number) => (typeof atolOpt === 'number' ? atolOpt : atolOpt[j]!);
  const maxSteps = options.maxSteps ?? 1_000_000;
  const nOut = tOut.length;
  const t0 = tOut[0]!;
  const tEnd = tOut[nOut - 1]!;
  const hMax = options.maxStep ?? tEnd - t0;
  const stops = [...breakpoints.filter((b) => b > t0 && b < tEnd), tEnd].sort((a, b) => a - b);
  const stats: DopriStats = { accepted: 0, rejected: 0, evaluations: 0 };
  const y = Float64Array.from(y0);
  const k1 = new Float64Array(dim),
    k2 = new Float64Array(dim),
    k3 = new Float64Array(dim);
  const k4 = new Float64Array(dim),
    k5 = new Float64Array(dim),
    k6 = new Float64Array(dim);
  const k7 = new Float64Array(dim),
    yt = new Float64Array(dim),
    yNew = new Float64Array(dim);
  const r1 = new Float64Array(dim),
    r2 = new Float64Array(dim),
    r3 = new Float64Array(dim);
  const r4 = new Float64Array(dim),
    r5 = new Float64Array(dim);
  for (let j = 0; j < dim; j++) out[j] = y[j]!;
  let iOut = 1;
  let t = t0;
  let h = 0;
  for (const stop of stops) {
    if (!(stop > t)) continue;
    f(t, y, k1); // (re)start: the right-hand side may jump at a breakpoint
    stats.evaluations++;
    if (h <= 0) h = initialStep(y, k1, stop - t, rtol, atol);
    let lastStep = false;
    while (!lastStep) {
      if (stats.accepted + stats.rejected >= maxSteps)
        throw new Error(`dopri5: more than ${maxSteps} steps`);
      h = Math.min(h, hMax);
      if (t + h >= stop || stop - (t + h) < 1e-9 * Math.abs(stop)) {
        h = stop - t;
        lastStep = true;
      }
      for (let j = 0; j < dim; j++) yt[j] = y[j]! + h * A21 * k1[j]!;
      f(t + C2 * h, yt, k2);
      for (let j = 0; j < dim; j++) yt[j] = y[j]! + h * (A31 * k1[j]! + A32 * k2[j]!);
      f(t + C3 * h, yt, k3);
      for (let j = 0; j < dim; j++)
        yt[j] = y[j]! + h * (A41 * k1[j]! + A42 * k2[j]! + A43 * k3[j]!);
      f(t + C4 * h, yt, k4);
      for (let j = 0; j < dim; j++)
        yt[j] = y[j]! + h * (A51 * k1[j]! + A52 * k2[j]! + A53 * k3[j]! + A54 * k4[j]!);
      f(t + C5 * h, yt, k5);
      for (let j = 0; j < dim; j++) {
        yt[j] =
          y[j]! + h * (A61 * k1[j]! + A62 * k2[j]! + A63 * k3[j]! + A64 * k4[j]! + A65 * k5[j]!);
      }
      f(t + h, yt, k6);
      for (let j = 0; j < dim; j++) {
        yNew[j] =
          y[j]! + h * (A71 * k1[j]! + A73 * k3[j]! + A74 * k4[j]! + A75 * k5[j]! + A76 * k6[j]!);
      }
      f(t + h, yNew, k7);
      stats.evaluations += 6;
      let err = 0;
      for (let j = 0; j < dim; j++) {
        const e =
          h * (E1 * k1[j]! + E3 * k3[j]! + E4 * k4[j]! + E5 * k5[j]! + E6 * k6[j]! + E7 * k7[j]!);
        const sc = atol(j) + rtol * Math.max(Math.abs(y[j]!), Math.abs(yNew[j]!));
        err += (e / sc) ** 2;
      }
      err = Math.sqrt(err / dim);
      if (!Number.isFinite(err)) err = 1e10;
      const fac = Math.min(10, Math.max(0.2, 0.9 * Math.pow(err > 1e-300 ? err : 1e-300, -0.2)));
      if (err > 1) {
        stats.rejected++;
        h *= Math.max(0.2, fac);
        lastStep = false;
        continue;
      }
      stats.accepted++;
      // dense output on [t, t + h]
      for (let j = 0; j < dim; j++) {
        const dy = yNew[j]! - y[j]!;
        const bspl = h * k1[j]! - dy;
        r1[j] = y[j]!;
        r2[j] = dy;
        r3[j] = bspl;
        r4[j] = dy - h * k7[j]! - bspl;
        r5[j] =
          h * (D1 * k1[j]! + D3 * k3[j]! + D4 * k4[j]! + D5 * k5[j]! + D6 * k6[j]! + D7 * k7[j]!);
      }
      const tNew = lastStep ? stop : t + h;
      while (iOut < nOut && tOut[iOut]! <= tNew) {
        const th = (tOut[iOut]! - t) / h;
        const th1 = 1 - th;
        for (let j = 0; j < dim; j++) {
          out[iOut * dim + j] =
            r1[j]! + th * (r2[j]! + th1 * (r3[j]! + th * (r4[j]! + th1 * r5[j]!)));
        }
        iOut++;
      }
      t = tNew;
      y.set(yNew);
      k1.set(k7); // first same as last
      h *= fac;
    }
  }
  for (; iOut < nOut; iOut++) for (let j = 0; j < dim; j++) out[iOut * dim + j] = y[j]!;
  return stats;
}

/** Hairer's starting-step heuristic, simplified: h with |h y'| about rtol |y| + atol. */
function initialStep(
  y: Float64Array,
  dy: Float64Array,
  span: number,
  rtol: number,
  atol: (j: number) => number,
): number {
  let d0 = 0;
  let d1 = 0;
  for (let j = 0; j < y.length; j++) {
    const sc = atol(j) + rtol * Math.abs(y[j]!);
    d0 += (y[j]! / sc) ** 2;
    d1 += (dy[j]! / sc) ** 2;
  }
  d0 = Math.sqrt(d0 / y.length);
  d1 = Math.sqrt(d1 / y.length);
  const h = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 * span : (0.01 * d0) / d1;
  return Math.min(Math.max(h, 1e-9 * span), span);
}
