import type { FlowPoint, FlowSeries } from './inflow-series.js';
import { seriesAt, seriesFromPoints, validateSeries } from './inflow-series.js';

/**
 * Inflow forecasts from the observed record. Every forecast is a series on t = now + k dt,
 * k = 0..horizon/dt, starting from the last observation (so the routing starts from what is known).
 */
export interface ForecastGrid {
  /** forecast start, s (default: the last observation's time) */
  now?: number;
  /** forecast length, s */
  horizon: number;
  /** spacing of the forecast points, s */
  dt: number;
}

export interface InflowForecast extends FlowSeries {
  readonly t: Float64Array;
  readonly q: Float64Array;
  method: 'persistence' | 'linear-trend' | 'recession' | 'hydrograph';
  /** the fitted parameters, for display */
  parameters: Record<string, number>;
  /** caveats the operator should see */
  notes: string[];
}

function checkObserved(obs: readonly FlowPoint[], min = 1): void {
  if (obs.length < min)
    throw new RangeError(
      `the observed record needs at least ${min} point(s), it has ${obs.length}`,
    );
  const p = validateSeries(seriesFromPoints(obs), 'observed');
  if (p.length > 0) throw new RangeError(p.slice(0, 5).join('; '));
}

function grid(obs: readonly FlowPoint[], g: ForecastGrid): { now: number; t: Float64Array } {
  if (!(g.dt > 0) || !(g.horizon > 0))
    throw new RangeError('forecast horizon and dt must be positive');
  const now = g.now ?? obs[obs.length - 1]!.t;
  const n = Math.ceil(g.horizon / g.dt - 1e-9);
  const t = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) t[k] = now + k * g.dt;
  return { now, t };
}

/** Flow at `now` from the record (linear between observations, last value held after). */
function flowNow(obs: readonly FlowPoint[], now: number): number {
  return seriesAt(seriesFromPoints(obs), now);
}

/** Persistence: the flow stays at its current value. */
export function persistenceForecast(obs: readonly FlowPoint[], g: ForecastGrid): InflowForecast {
  checkObserved(obs);
  const { now, t } = grid(obs, g);
  const q0 = flowNow(obs, now);
  return {
    method: 'persistence',
    t,
    q: new Float64Array(t.length).fill(q0),
    parameters: { q0 },
    notes: [],
  };
}

/** Least-squares slope of q on t over the points; NaN with fewer than 2 distinct times. */
export function leastSquaresSlope(
  ts: ArrayLike<number>,
  qs: ArrayLike<number>,
): { slope: number; intercept: number } {
  const n = ts.length;
  let mt = 0;
  let mq = 0;
  for (let i = 0; i < n; i++) {
    mt += ts[i]!;
    mq += qs[i]!;
  }
  mt /= n;
  mq /= n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (ts[i]! - mt) * (qs[i]! - mq);
    sxx += (ts[i]! - mt) ** 2;
  }
  const slope = sxx > 0 ? sxy / sxx : NaN;
  return { slope, intercept: mq - slope * mt };
}

export interface TrendOptions extends ForecastGrid {
  /** fit window before now, s (default 3 h) */
  window?: number;
}

/**
 * Linear trend: the least-squares slope of the last `window` of the record, continued from the
 * current flow and floored at 0. Reasonable for a few hours; it knows nothing of the peak to come.
 */
export function linearTrendForecast(obs: readonly FlowPoint[], o: TrendOptions): InflowForecast {
  checkObserved(obs, 2);
  const { now, t } = grid(obs, o);
  const window = o.window ?? 3 * 3600;
  const used = obs.filter((p) => p.t >= now - window && p.t <= now);
  if (used.length < 2)
    throw new RangeError(
      `the trend window (${window} s before now) holds fewer than 2 observations`,
    );
  const { slope } = leastSquaresSlope(
    used.map((p) => p.t),
    used.map((p) => p.q),
  );
  const q0 = flowNow(obs, now);
  const q = Float64Array.from(t, (x) => Math.max(0, q0 + slope * (x - now)));
  const notes = [
    'a straight-line trend: it cannot foresee the peak or the recession; use it for short horizons',
  ];
  if (q.some((v) => v === 0) && slope < 0)
    notes.push('the falling trend reaches zero flow within the horizon and is held at 0');
  return { method: 'linear-trend', t, q, parameters: { q0, slope, window }, notes };
}

export interface RecessionOptions extends ForecastGrid {
  /** flow the recession tends to, m3/s (default 0) */
  baseflow?: number;
  /** recession constant k, s; estimated from the falling limb when omitted */
  constant?: number;
  /** window before now used to estimate k, s (default 12 h) */
  window?: number;
}

/**
 * Exponential recession after the peak: q(t) = qb + (q_now - qb) exp(-(t - now) / k), the classical
 * linear-reservoir recession (Maillet 1905; reviewed by Tallaksen, J. Hydrol. 165, 1995). k is fitted by least squares of ln(q - qb) against t over the record after its peak
 * within the window, unless given. If the record is still rising the forecast says so.
 */
export function recessionForecast(obs: readonly FlowPoint[], o: RecessionOptions): InflowForecast {
  checkObserved(obs);
  const { now, t } = grid(obs, o);
  const qb = o.baseflow ?? 0;
  const q0 = flowNow(obs, now);
  const notes: string[] = [];
  const window = o.window ?? 12 * 3600;
  const recent = obs.filter((p) => p.t >= now - window && p.t <= now);
  let peakIdx = 0;
  recent.forEach((p, i) => {
    if (p.q >= recent[peakIdx]!.q) peakIdx = i;
  });
  const falling = recent.slice(peakIdx).filter((p) => p.q > qb);
  let k = o.constant;
  if (peakIdx === recent.length - 1 && recent.length > 1) {
    notes.push('the record is still rising: a recession assumes the peak has passed');
  }
  if (k === undefined) {
    const fit =
      falling.length >= 3
        ? leastSquaresSlope(
            falling.map((p) => p.t),
            falling.map((p) => Math.log(p.q - qb)),
          )
        : { slope: NaN };
    if (!(fit.slope < 0)) {
      throw new RangeError(
        'cannot estimate the recession constant: fewer than 3 falling observations after the peak ' +
          'within the window (give `constant`, or use another forecast)',
      );
    }
    k = -1 / fit.slope;
  }
  if (!(k > 0)) throw new RangeError(`recession constant ${k} s must be positive`);
  if (q0 < qb)
    notes.push(`the current flow is below the baseflow ${qb} m3/s: the forecast rises towards it`);
  const q = Float64Array.from(t, (x) => qb + (q0 - qb) * Math.exp(-(x - now) / k));
  return { method: 'recession', t, q, parameters: { q0, baseflow: qb, constant: k }, notes };
}

/**
 * A user hydrograph (for example parsed by parseHydrographCsv) on the forecast grid. `relative`:
 * its times count from now (default), else they are absolute (same clock as now). Outside the
 * hydrograph the flow is held at its end values, and a note says so.
 */
export function hydrographForecast(
  points: readonly FlowPoint[],
  o: ForecastGrid & { now: number; relative?: boolean },
): InflowForecast {
  checkObserved(points);
  const { now, t } = grid(points, o);
  const offset = o.relative === false ? 0 : now;
  const s = seriesFromPoints(points.map((p) => ({ t: p.t + offset, q: p.q })));
  const q = Float64Array.from(t, (x) => seriesAt(s, x));
  const notes: string[] = [];
  const first = s.t[0]!;
  const last = s.t[s.t.length - 1]!;
  if (first > now) notes.push('the hydrograph starts after now: its first flow is held before it');
  if (last < t[t.length - 1]!)
    notes.push('the hydrograph ends before the horizon: its last flow is held after it');
  return { method: 'hydrograph', t, q, parameters: { points: points.length }, notes };
}
