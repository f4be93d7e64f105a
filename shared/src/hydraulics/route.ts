import { CLOSED } from './discharge.js';
import { assertSeries, sampleSeries, seriesIntegral } from './inflow-series.js';
import { compileOutflow, type OutflowModel } from './outflow-model.js';
import { pulsRun, type PulsContext } from './puls-core.js';
import { massBalance, type RoutingOptions, type RoutingResult } from './routing-types.js';
import { compileSchedule } from './schedule.js';

/** Checks the common routing options; returns the start time and number of steps. */
export function routingGrid(o: RoutingOptions): { t0: number; steps: number } {
  assertSeries(o.inflow);
  if (!(o.dt > 0) || !Number.isFinite(o.dt))
    throw new RangeError(`time step ${o.dt} s must be a positive number`);
  if (!(o.duration > 0) || !Number.isFinite(o.duration)) {
    throw new RangeError(`duration ${o.duration} s must be a positive number`);
  }
  const steps = Math.round(o.duration / o.dt);
  if (Math.abs(steps * o.dt - o.duration) > 1e-9 * o.duration) {
    throw new RangeError(`duration ${o.duration} s is not a whole number of ${o.dt} s steps`);
  }
  if (steps > 10_000_000) throw new RangeError(`${steps} steps is too many (at most 10,000,000)`);
  if (o.releaseLimit && !(o.releaseLimit.increase > 0 && o.releaseLimit.decrease > 0)) {
    throw new RangeError('release limits must be positive (m3/s per s)');
  }
  return { t0: o.start ?? o.inflow.t[0]!, steps };
}

/** Builds the step context for the storage-indication core (exported for ensembles and searches). */
export function pulsContext(
  o: RoutingOptions,
  model: OutflowModel = compileOutflow(o.structures),
  shift = 0,
): PulsContext {
  const { t0, steps } = routingGrid(o);
  return {
    curve: o.storage,
    model,
    plan: compileSchedule(model, o.schedule ?? [], shift),
    t0,
    dt: o.dt,
    steps,
    tailwater: o.tailwater ?? NaN,
    limit: o.releaseLimit ?? null,
  };
}

/**
 * Level-pool routing by the storage-indication (modified Puls) method at a fixed time step, with
 * gate and valve moves at their travel speeds and release rate-of-change limits.
 */
export function routeStorageIndication(o: RoutingOptions): RoutingResult {
  const model = compileOutflow(o.structures);
  const ctx = pulsContext(o, model);
  const { t0, dt, steps } = ctx;
  const inflow = sampleSeries(o.inflow, t0, dt, steps);
  const elevation = new Float64Array(steps + 1);
  const storage = new Float64Array(steps + 1);
  const outflow = new Float64Array(steps + 1);
  const openings = model.controls.map(() => new Float64Array(steps + 1));
  const op0 = model.openingsOf(o.initialSettings ?? CLOSED);
  const r = pulsRun(ctx, inflow, o.initialElevation, op0, {
    elevation,
    storage,
    outflow,
    openings,
  });
  const fmt = (t: number) => `${(t / 3600).toFixed(2)} h`;
  if (r.leftTable && o.aboveTable !== 'stop') {
    throw new RangeError(
      `the pool rises above the top of the storage table (${o.storage.maxElevation} m) between ` +
        `${fmt(t0 + r.lastIndex * dt)} and ${fmt(t0 + (r.lastIndex + 1) * dt)}; extend the table or use aboveTable: 'stop'`,
    );
  }
  const n = r.lastIndex + 1;
  const time = new Float64Array(n);
  for (let i = 0; i < n; i++) time[i] = t0 + i * dt;
  const cut = (a: Float64Array) => (n === a.length ? a : a.slice(0, n));
  const tEnd = t0 + r.lastIndex * dt;
  return {
    method: 'storage-indication',
    time,
    inflow: cut(inflow),
    elevation: cut(elevation),
    storage: cut(storage),
    outflow: cut(outflow),
    openings: Object.fromEntries(model.controls.map((c, k) => [c.id, cut(openings[k]!)])),
    peakElevation: r.peakElevation,
    peakElevationTime: t0 + r.peakElevationIndex * dt,
    peakOutflow: r.peakOutflow,
    peakOutflowTime: t0 + r.peakOutflowIndex * dt,
    massBalance: massBalance(
      seriesIntegral(o.inflow, t0, tEnd),
      r.outflowVolume,
      r.storageEnd - r.storage0,
      r.inflowVolume,
    ),
    throttled: r.throttled,
    leftTableAt: r.leftTable ? t0 + (r.lastIndex + 1) * dt : null,
  };
}
