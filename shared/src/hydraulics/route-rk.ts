import { CLOSED } from './discharge.js';
import { dopri5, type DopriStats } from './dopri.js';
import { seriesAt, seriesIntegral, seriesKnotsWithin } from './inflow-series.js';
import { compileOutflow } from './outflow-model.js';
import { routeStorageIndication, routingGrid } from './route.js';
import { massBalance, type RoutingOptions, type RoutingResult } from './routing-types.js';
import {
  compileSchedule,
  scheduleTrajectory,
  trajectoryAt,
  trajectoryBreakpoints,
  type OpeningTrajectory,
} from './schedule.js';

export interface RungeKuttaOptions extends RoutingOptions {
  /** opening trajectories to use instead of the schedule's (for example a recorded run) */
  trajectory?: OpeningTrajectory;
  rtol?: number;
  /** absolute tolerance on storage, m3 (default 1e-9 of the table's top storage) */
  atol?: number;
}

export interface RungeKuttaResult extends RoutingResult {
  stats: DopriStats;
}

/** The openings a routing result recorded, as trajectories (linear between its steps). */
export function trajectoryOfResult(r: RoutingResult, ids: readonly string[]): OpeningTrajectory {
  return {
    times: ids.map(() => r.time),
    values: ids.map((id) => r.openings[id] ?? new Float64Array(r.time.length)),
  };
}

/**
 * Independent cross-check of the storage-indication router: dS/dt = I(t) - O(h(S), openings(t))
 * integrated by Dormand-Prince 5(4) with tight tolerances, output every dt. The openings follow
 * the schedule's exact kinematics; when a release limit is given they are taken from a
 * storage-indication run (the limit is a rule of that stepping, not a property of the ODE).
 * The outflow volume is integrated as a second state so that the mass balance uses the method's
 * own quadrature.
 */
export function routeDormandPrince(o: RungeKuttaOptions): RungeKuttaResult {
  const { t0, steps } = routingGrid(o);
  const model = compileOutflow(o.structures);
  const curve = o.storage;
  const op0 = model.openingsOf(o.initialSettings ?? CLOSED);
  const tEnd = t0 + steps * o.dt;
  let trajectory = o.trajectory;
  if (!trajectory && o.releaseLimit) {
    const ids = model.controls.map((c) => c.id);
    trajectory = trajectoryOfResult(routeStorageIndication({ ...o, aboveTable: 'stop' }), ids);
  }
  trajectory ??= scheduleTrajectory(compileSchedule(model, o.schedule ?? []), op0, t0, tEnd);
  const tw = o.tailwater ?? NaN;
  const op = new Float64Array(model.controls.length);
  const sMin = curve.minStorage;
  const sMax = curve.maxStorage;
  const levelOf = (s: number) =>
    s >= sMax ? curve.maxElevation : s <= sMin ? curve.minElevation : curve.elevationAt(s);
  const rhs = (t: number, y: Float64Array, dy: Float64Array) => {
    const h = levelOf(y[0]!);
    trajectoryAt(trajectory, t, op);
    const q = model.outflow(h, op, tw);
    dy[0] = seriesAt(o.inflow, t) - q;
    dy[1] = q;
  };
  const tOut = new Float64Array(steps + 1);
  for (let i = 0; i <= steps; i++) tOut[i] = t0 + i * o.dt;
  const y0 = Float64Array.of(curve.storageAt(o.initialElevation), 0);
  const out = new Float64Array(2 * (steps + 1));
  const breaks = [...seriesKnotsWithin(o.inflow, t0, tEnd), ...trajectoryBreakpoints(trajectory)];
  const atol = o.atol ?? 1e-9 * Math.max(1, sMax);
  const stats = dopri5(rhs, y0, tOut, out, breaks, { rtol: o.rtol ?? 1e-9, atol });

  let n = steps + 1;
  for (let i = 0; i <= steps; i++) {
    if (out[2 * i]! > sMax) {
      n = i;
      break;
    }
  }
  if (n <= steps && o.aboveTable !== 'stop') {
    throw new RangeError(
      `the pool rises above the top of the storage table (${curve.maxElevation} m) before ${(tOut[n]! / 3600).toFixed(2)} h`,
    );
  }
  const time = tOut.slice(0, n);
  const storage = new Float64Array(n);
  const elevation = new Float64Array(n);
  const outflow = new Float64Array(n);
  const inflow = new Float64Array(n);
  const openings = model.controls.map(() => new Float64Array(n));
  let peakH = -Infinity;
  let peakHi = 0;
  let peakQ = -Infinity;
  let peakQi = 0;
  for (let i = 0; i < n; i++) {
    storage[i] = out[2 * i]!;
    elevation[i] = levelOf(storage[i]!);
    trajectoryAt(trajectory, time[i]!, op);
    for (let k = 0; k < op.length; k++) openings[k]![i] = op[k]!;
    outflow[i] = model.outflow(elevation[i]!, op, tw);
    inflow[i] = seriesAt(o.inflow, time[i]!);
    if (elevation[i]! > peakH) [peakH, peakHi] = [elevation[i]!, i];
    if (outflow[i]! > peakQ) [peakQ, peakQi] = [outflow[i]!, i];
  }
  const last = n - 1;
  return {
    method: 'dormand-prince',
    time,
    inflow,
    elevation,
    storage,
    outflow,
    openings: Object.fromEntries(model.controls.map((c, k) => [c.id, openings[k]!])),
    peakElevation: n <= steps ? curve.maxElevation : peakH,
    peakElevationTime: time[peakHi]!,
    peakOutflow: peakQ,
    peakOutflowTime: time[peakQi]!,
    massBalance: massBalance(
      seriesIntegral(o.inflow, t0, time[last]!),
      out[2 * last + 1]!,
      storage[last]! - storage[0]!,
    ),
    throttled: false,
    leftTableAt: n <= steps ? tOut[n]! : null,
    stats,
  };
}
