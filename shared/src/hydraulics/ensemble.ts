import { CLOSED } from './discharge.js';
import { sampleSeries } from './inflow-series.js';
import { compileOutflow } from './outflow-model.js';
import { createPrng } from './prng.js';
import { pulsRun } from './puls-core.js';
import { quantileSorted } from './quantile.js';
import { pulsContext } from './route.js';
import type { RoutingOptions } from './routing-types.js';

/**
 * How the inflow scenarios are made: each member multiplies the base forecast by
 *   m(t) = exp(sigma(L) z(t) - sigma(L)^2 / 2),  sigma(L) = sigma (1 - exp(-L / growth)),
 * L the lead time, z a standard-normal AR(1) process with correlation exp(-dt / correlation),
 * drawn every `interval` and linear between. So E[m] = 1 (the base forecast stays the mean), the
 * spread is 0 at the start (the present flow is observed) and grows with lead time, and errors
 * persist for hours as forecast errors do. The figures are judgement defaults, not calibrated.
 */
export interface EnsembleSpread {
  /** standard deviation of ln(m) at long lead times (default 0.3) */
  sigma?: number;
  /** lead time scale of the spread's growth, s (default 12 h) */
  growth?: number;
  /** correlation time of the noise, s (default 6 h) */
  correlation?: number;
  /** interval of the noise draws, s (default 900) */
  interval?: number;
}

export interface EnsembleOptions extends RoutingOptions {
  members: number;
  seed: number | string;
  spread?: EnsembleSpread;
  /** probabilities of the elevation quantiles (default [0.1, 0.5, 0.9]) */
  quantiles?: readonly number[];
  /** levels whose probability of being reached is reported */
  thresholds?: readonly { id: string; elevation: number }[];
}

export interface EnsembleResult {
  members: number;
  seed: number | string;
  time: Float64Array;
  quantiles: readonly number[];
  /** per quantile (same order), pool elevation over time, m */
  elevation: Float64Array[];
  /** quantiles (same order) of the members' peak elevation and peak outflow */
  peakElevation: number[];
  peakOutflow: number[];
  /** fraction of members whose pool reaches each threshold */
  exceedance: { id: string; elevation: number; probability: number }[];
  /** members whose pool rose above the storage table (held at its top from then on) */
  membersAboveTable: number;
  /** the elevation quantile for probability p, if it was asked for */
  band(p: number): Float64Array | undefined;
}

/**
 * Multipliers for one member on the step grid (exported for tests): lognormal at the noise knots
 * (every `interval`), linear between them (which keeps the mean at 1).
 */
export function memberMultipliers(
  prng: ReturnType<typeof createPrng>,
  steps: number,
  dt: number,
  spread: Required<EnsembleSpread>,
  out: Float64Array,
): Float64Array {
  const every = Math.max(1, Math.round(spread.interval / dt));
  const rho = Math.exp(-(every * dt) / spread.correlation);
  const innov = Math.sqrt(1 - rho * rho);
  let z = prng.normal();
  let mPrev = 1; // lead 0: no spread
  out[0] = 1;
  for (let n0 = 0; n0 < steps; n0 += every) {
    const n1 = Math.min(steps, n0 + every);
    z = rho * z + innov * prng.normal();
    const sigma = spread.sigma * (1 - Math.exp(-(n1 * dt) / spread.growth));
    const m1 = Math.exp(sigma * z - 0.5 * sigma * sigma);
    const span = n1 - n0;
    for (let n = n0 + 1; n <= n1; n++) out[n] = mPrev + ((m1 - mPrev) * (n - n0)) / span;
    mPrev = m1;
  }
  return out;
}

/**
 * Sorts col ascending carrying order along, by insertion: fast when col is nearly sorted (members
 * keep their ranks from one step to the next). Gives up after `budget` moves and returns false.
 */
function insertionSort(col: Float64Array, order: Int32Array, budget: number): boolean {
  let moves = 0;
  for (let i = 1; i < col.length; i++) {
    const v = col[i]!;
    const o = order[i]!;
    let j = i - 1;
    while (j >= 0 && col[j]! > v) {
      col[j + 1] = col[j]!;
      order[j + 1] = order[j]!;
      j--;
      if (++moves > budget) {
        col[j + 1] = v;
        order[j + 1] = o;
        return false;
      }
    }
    col[j + 1] = v;
    order[j + 1] = o;
  }
  return true;
}

export function runEnsemble(o: EnsembleOptions): EnsembleResult {
  if (!Number.isInteger(o.members) || o.members < 1 || o.members > 100_000) {
    throw new RangeError(`members ${o.members} must be a whole number from 1 to 100,000`);
  }
  const spread: Required<EnsembleSpread> = {
    sigma: o.spread?.sigma ?? 0.3,
    growth: o.spread?.growth ?? 12 * 3600,
    correlation: o.spread?.correlation ?? 6 * 3600,
    interval: o.spread?.interval ?? 900,
  };
  if (!(spread.sigma >= 0 && spread.growth > 0 && spread.correlation > 0 && spread.interval > 0)) {
    throw new RangeError(
      'ensemble spread: sigma must be >= 0 and growth, correlation, interval > 0',
    );
  }
  const ps = o.quantiles ?? [0.1, 0.5, 0.9];
  const model = compileOutflow(o.structures);
  const ctx = pulsContext(o, model);
  const { steps, dt, t0 } = ctx;
  const m = o.members;
  const base = sampleSeries(o.inflow, t0, dt, steps);
  const op0 = model.openingsOf(o.initialSettings ?? CLOSED);
  const prng = createPrng(o.seed);
  const mult = new Float64Array(steps + 1);
  const q = new Float64Array(steps + 1);
  const elev = new Float64Array(steps + 1);
  const matrix = new Float32Array((steps + 1) * m); // time-major: [n * m + member]
  const peaks = new Float64Array(m);
  const peakQ = new Float64Array(m);
  let above = 0;
  for (let k = 0; k < m; k++) {
    memberMultipliers(prng, steps, dt, spread, mult);
    for (let n = 0; n <= steps; n++) q[n] = base[n]! * mult[n]!;
    const r = pulsRun(ctx, q, o.initialElevation, op0, { elevation: elev });
    if (r.leftTable) {
      above++;
      elev.fill(o.storage.maxElevation, r.lastIndex + 1);
    }
    for (let n = 0; n <= steps; n++) matrix[n * m + k] = elev[n]!;
    peaks[k] = r.peakElevation;
    peakQ[k] = r.peakOutflow;
  }
  const bands = ps.map(() => new Float64Array(steps + 1));
  const col = new Float64Array(m);
  // members keep their ranks from step to step: sort each step in the previous step's order
  const order = Int32Array.from({ length: m }, (_, k) => k);
  const budget = 8 * m * Math.max(1, Math.log2(m));
  for (let n = 0; n <= steps; n++) {
    const row = n * m;
    for (let k = 0; k < m; k++) col[k] = matrix[row + order[k]!]!;
    if (!insertionSort(col, order, budget)) {
      for (let k = 0; k < m; k++) col[k] = matrix[row + k]!;
      col.sort();
    }
    for (let i = 0; i < ps.length; i++) bands[i]![n] = quantileSorted(col, ps[i]!);
  }
  peaks.sort();
  peakQ.sort();
  const time = new Float64Array(steps + 1);
  for (let n = 0; n <= steps; n++) time[n] = t0 + n * dt;
  return {
    members: m,
    seed: o.seed,
    time,
    quantiles: ps,
    elevation: bands,
    peakElevation: ps.map((p) => quantileSorted(peaks, p)),
    peakOutflow: ps.map((p) => quantileSorted(peakQ, p)),
    exceedance: (o.thresholds ?? []).map((th) => {
      let c = 0;
      for (let k = 0; k < m; k++) if (peaks[k]! >= th.elevation) c++;
      return { id: th.id, elevation: th.elevation, probability: c / m };
    }),
    membersAboveTable: above,
    band(p) {
      const i = ps.findIndex((x) => Math.abs(x - p) < 1e-12);
      return i < 0 ? undefined : bands[i];
    },
  };
}
