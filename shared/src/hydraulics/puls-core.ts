import { hermiteValue, segmentOf } from './hermite.js';
import type { OutflowModel } from './outflow-model.js';
import type { ReleaseLimit } from './routing-types.js';
import { advanceControl, stillUntil, type CompiledSchedule } from './schedule.js';
import type { StorageCurve } from './storage-curve.js';

/**
 * The storage-indication (modified Puls) step, shared by the router, the ensemble and the
 * decision searches. Per step, with openings known at the step end:
 *   2 S(h1)/dt + O(h1, openings1) = I0 + I1 + 2 S(h0)/dt - O(h0, openings0),
 * solved for h1 by Newton's method (dS/dh = area from the storage curve, dO/dh by secant) inside
 * a bracket that only shrinks, falling back to bisection; the left side increases with h1, so the
 * root is unique. Storage is the state: S1 comes from the step equation, so the water balance
 * closes to round-off; the level is within about 1e-9 m of the one holding S1. With fixed openings this is exactly the tabular storage-indication method
 * (Chow, Maidment and Mays, Applied Hydrology, 1988, sec. 8.2) without its table interpolation.
 */
export interface PulsContext {
  curve: StorageCurve;
  model: OutflowModel;
  plan: CompiledSchedule;
  t0: number;
  dt: number;
  steps: number;
  /** NaN for none */
  tailwater: number;
  limit: ReleaseLimit | null;
}

/** Optional outputs, each steps + 1 long. */
export interface PulsTrace {
  elevation?: Float64Array | Float32Array;
  storage?: Float64Array;
  outflow?: Float64Array;
  /** per control */
  openings?: Float64Array[];
}

export interface PulsSummary {
  peakElevation: number;
  peakElevationIndex: number;
  peakOutflow: number;
  peakOutflowIndex: number;
  /** last step index computed (steps unless the pool left the table) */
  lastIndex: number;
  leftTable: boolean;
  throttled: boolean;
  /** storage at step 0 and at lastIndex, m3 */
  storage0: number;
  storageEnd: number;
  /** trapezoidal sums of the sampled inflow and outflow up to lastIndex, m3 */
  inflowVolume: number;
  outflowVolume: number;
}

/** bracket width at which bisection stops, m */
const TOL_H = 1e-10;
/** Newton step below which the level is accepted (after that last update), m */
const TOL_ACCEPT = 1e-4;
/** bound on |Newton step| x (dO/dh share of the derivative) for accepting, m */
const TOL_SLOPE = 1e-7;

export function pulsRun(
  ctx: PulsContext,
  inflow: Float64Array,
  h0: number,
  initialOpenings: Float64Array,
  trace: PulsTrace = {},
): PulsSummary {
  const { curve, model, plan, t0, dt, steps, tailwater: tw, limit } = ctx;
  const x = curve.knots.elevation;
  const y = curve.knots.storage;
  const d = curve.knots.slope;
  const hmin = curve.minElevation;
  const hmax = curve.maxElevation;
  const k2 = 2 / dt;
  const nc = initialOpenings.length;
  let op = Float64Array.from(initialOpenings);
  let next = new Float64Array(nc);
  const trial = new Float64Array(nc);
  // per control: the time until which it is known to stand still (skips the kinematics)
  const still = new Float64Array(nc);
  for (let k = 0; k < nc; k++) still[k] = stillUntil(plan, k, op[k]!, t0);
  const { elevation: eT, storage: sT, outflow: oT, openings: opT } = trace;

  curve.storageAt(h0); // range check: throws outside the table
  let h = h0;
  let hLast = h0;
  let seg = segmentOf(x, h0);
  let s = hermiteValue(x, y, d, segmentOf(x, h), h);
  let o = model.outflow(h, op, tw);
  let slopeO = 0;
  let peakH = h;
  let peakHi = 0;
  let peakQ = o;
  let peakQi = 0;
  let throttled = false;
  let vin = 0;
  let vout = 0;
  const record = (n: number) => {
    if (eT) eT[n] = h;
    if (sT) sT[n] = s;
    if (oT) oT[n] = o;
    if (opT) for (let k = 0; k < nc; k++) opT[k]![n] = op[k]!;
  };
  record(0);
  let n = 0;
  for (; n < steps; n++) {
    const ta = t0 + n * dt;
    const tb = ta + dt;
    let moved = false;
    for (let k = 0; k < nc; k++) {
      if (tb <= still[k]!) next[k] = op[k]!;
      else {
        next[k] = advanceControl(plan, k, op[k]!, ta, tb);
        moved = true;
      }
    }
    if (limit && moved) {
      const q1 = model.outflow(h, next, tw);
      const up = limit.increase * dt;
      const down = limit.decrease * dt;
      if (q1 - o > up || o - q1 > down) {
        const goal = q1 - o > up ? o + up : o - down;
        const rising = q1 > o;
        let lo = 0;
        let hi = 1;
        for (let it = 0; it < 50; it++) {
          const mid = 0.5 * (lo + hi);
          for (let k = 0; k < nc; k++) trial[k] = op[k]! + mid * (next[k]! - op[k]!);
          const q = model.outflow(h, trial, tw);
          if (rising ? q <= goal : q >= goal) lo = mid;
          else hi = mid;
        }
        for (let k = 0; k < nc; k++) next[k] = op[k]! + lo * (next[k]! - op[k]!);
        throttled = true;
      }
    }
    const i0 = inflow[n]!;
    const i1 = inflow[n + 1]!;
    const rhs = i0 + i1 + k2 * s - o;
    // Newton inside a shrinking bracket [lo, hi]; the table ends are tried before bisecting there
    let lo = hmin;
    let hi = hmax;
    // first guess: linear extrapolation of the last two levels
    let hn = h + (h - hLast);
    if (!(hn > hmin && hn < hmax)) hn = h;
    let hPrev = NaN;
    let oPrev = NaN;
    let sN = 0;
    let oN = 0;
    for (let it = 0; it < 200; it++) {
      if (!(hn >= x[seg]! && hn < x[seg + 1]!)) seg = segmentOf(x, hn);
      // storage and area (dS/dh) of the Hermite curve, as hermiteValue / hermiteSlope
      const xa = x[seg]!;
      const hh = x[seg + 1]! - xa;
      const tt = (hn - xa) / hh;
      const t2 = tt * tt;
      const t3 = t2 * tt;
      const ya = y[seg]!;
      const yb = y[seg + 1]!;
      const da = d[seg]!;
      const db = d[seg + 1]!;
      const sv =
        (2 * t3 - 3 * t2 + 1) * ya +
        (t3 - 2 * t2 + tt) * hh * da +
        (-2 * t3 + 3 * t2) * yb +
        (t3 - t2) * hh * db;
      sN = sv < ya ? ya : sv > yb ? yb : sv;
      const area =
        ((6 * t2 - 6 * tt) * (ya - yb)) / hh + (3 * t2 - 4 * tt + 1) * da + (3 * t2 - 2 * tt) * db;
      oN = model.outflow(hn, next, tw);
      const f = k2 * sN + oN - rhs;
      if (f < 0) {
        if (hn >= hmax) {
          hn = NaN; // even the top of the table holds too little: the pool leaves the table
          break;
        }
        lo = hn;
      } else {
        if (hn <= hmin || f === 0) break; // root, or the pool is drawn down to the bottom of the table
        hi = hn;
      }
      if (it > 0 && hn !== hPrev) {
        const sl = (oN - oPrev) / (hn - hPrev);
        slopeO = sl > 0 ? sl : 0;
      }
      const deriv = k2 * area + slopeO;
      const stepH = deriv > 0 ? f / deriv : NaN;
      // the update's error is about |stepH| x (share of dO/dh in the derivative) x (error of its
      // secant estimate): accept when that is below TOL_SLOPE
      const a = stepH < 0 ? -stepH : stepH;
      if (
        a <= TOL_ACCEPT &&
        a * slopeO <= TOL_SLOPE * deriv &&
        hn - stepH > lo &&
        hn - stepH < hi
      ) {
        // converged: take the Newton update without another evaluation (its error is of the
        // order of stepH^2), and the storage from the step equation itself, so that the water
        // balance closes to round-off
        hn -= stepH;
        oN -= slopeO * stepH;
        sN = 0.5 * dt * (rhs - oN);
        break;
      }
      if (hi - lo <= TOL_H) break;
      let cand = hn - stepH;
      if (!(cand > lo && cand < hi)) {
        if (cand >= hi && hi === hmax) cand = hmax;
        else if (cand <= lo && lo === hmin) cand = hmin;
        else cand = 0.5 * (lo + hi);
      }
      hPrev = hn;
      oPrev = oN;
      hn = cand;
    }
    if (Number.isNaN(hn)) {
      return summary(true);
    }
    vin += 0.5 * dt * (i0 + i1);
    vout += 0.5 * dt * (o + oN);
    hLast = h;
    h = hn;
    s = sN;
    o = oN;
    const tmp = op;
    op = next;
    next = tmp;
    if (moved)
      for (let k = 0; k < nc; k++) if (tb > still[k]!) still[k] = stillUntil(plan, k, op[k]!, tb);
    if (h > peakH) {
      peakH = h;
      peakHi = n + 1;
    }
    if (o > peakQ) {
      peakQ = o;
      peakQi = n + 1;
    }
    record(n + 1);
  }
  return summary(false);

  function summary(left: boolean): PulsSummary {
    return {
      peakElevation: left ? hmax : peakH,
      peakElevationIndex: left ? n + 1 : peakHi,
      peakOutflow: peakQ,
      peakOutflowIndex: peakQi,
      lastIndex: n,
      leftTable: left,
      throttled,
      storage0: curve.storageAt(h0),
      storageEnd: s,
      inflowVolume: vin,
      outflowVolume: vout,
    };
  }
}
