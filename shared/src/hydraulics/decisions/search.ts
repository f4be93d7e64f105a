import { CLOSED } from '../discharge.js';
import { sampleSeries } from '../inflow-series.js';
import { compileOutflow, type OutflowModel } from '../outflow-model.js';
import { pulsRun, type PulsContext, type PulsSummary } from '../puls-core.js';
import { pulsContext } from '../route.js';
import type { RoutingOptions } from '../routing-types.js';
import { compileSchedule, type GateSchedule, type ScheduleEntry } from '../schedule.js';

/**
 * A routing problem prepared for many runs that differ only in the gate schedule (inflow sampled
 * once, structures compiled once). Every run applies the options' release limits, so every plan
 * these searches return respects them.
 */
export interface Scenario {
  readonly options: RoutingOptions;
  readonly model: OutflowModel;
  readonly ctx: PulsContext;
  /** peak of a run with the options' schedule plus `extra` entries */
  run(extra: GateSchedule): PulsSummary;
  runs: number;
}

export function prepareScenario(o: RoutingOptions): Scenario {
  const model = compileOutflow(o.structures);
  const ctx = pulsContext(o, model);
  const inflow = sampleSeries(o.inflow, ctx.t0, ctx.dt, ctx.steps);
  const op0 = model.openingsOf(o.initialSettings ?? CLOSED);
  const base = o.schedule ?? [];
  const sc: Scenario = {
    options: o,
    model,
    ctx,
    runs: 0,
    run(extra) {
      sc.runs++;
      const plan = compileSchedule(model, [...base, ...extra]);
      return pulsRun({ ...ctx, plan }, inflow, o.initialElevation, op0);
    },
  };
  return sc;
}

export interface OpeningSearch {
  /** gates (or valves) opened together to the same opening */
  ids: readonly string[];
  /** the peak pool level must not exceed this, m */
  target: number;
  /** when the command is given, s (default: the run start) */
  start?: number;
  /** opening resolution, m for gates / % for valves (default 0.01 m, 0.5 %) */
  tolerance?: number;
}

export interface OpeningResult {
  status: 'ok' | 'not-needed' | 'impossible';
  /** smallest opening that keeps the peak at or below the target (null when impossible) */
  opening: number | null;
  peakElevation: number;
  peakTime: number;
  /** the plan: entries to add to the schedule */
  plan: ScheduleEntry[];
  throttled: boolean;
  runs: number;
  message: string;
}

/**
 * The smallest common opening of the given gates, commanded at `start`, that keeps the peak at or
 * below the target: bisection on the opening, which is valid because a larger opening never
 * raises the peak (outflow is non-decreasing in every opening; property-tested).
 */
export function smallestOpening(
  o: RoutingOptions,
  q: OpeningSearch,
  scenario = prepareScenario(o),
): OpeningResult {
  const ks = q.ids.map((id) => {
    const k = scenario.model.indexOf(id);
    if (k < 0) throw new RangeError(`no gate or valve "${id}"`);
    return k;
  });
  if (ks.length === 0) throw new RangeError('give at least one gate or valve to open');
  const controls = ks.map((k) => scenario.model.controls[k]!);
  const max = Math.min(...controls.map((c) => c.max));
  const tol = q.tolerance ?? (controls.every((c) => c.kind === 'valve') ? 0.5 : 0.01);
  const start = q.start ?? scenario.ctx.t0;
  const runs0 = scenario.runs;
  const planOf = (x: number) => q.ids.map((id) => ({ time: start, id, target: x }));
  const ok = (r: PulsSummary) => !r.leftTable && r.peakElevation <= q.target;
  const t = (r: PulsSummary) => scenario.ctx.t0 + r.peakElevationIndex * scenario.ctx.dt;
  const result = (
    status: OpeningResult['status'],
    x: number | null,
    r: PulsSummary,
    message: string,
  ): OpeningResult => ({
    status,
    opening: x,
    peakElevation: r.peakElevation,
    peakTime: t(r),
    plan: x === null ? [] : planOf(x),
    throttled: r.throttled,
    runs: scenario.runs - runs0,
    message,
  });
  const r0 = scenario.run(planOf(0));
  if (ok(r0))
    return result(
      'not-needed',
      0,
      r0,
      `the peak stays at or below ${q.target} m with the gates shut`,
    );
  const rMax = scenario.run(planOf(max));
  if (!ok(rMax)) {
    return result(
      'impossible',
      null,
      rMax,
      `even fully open (${max}) from ${start} s the peak reaches ${rMax.peakElevation.toFixed(3)} m, above ${q.target} m`,
    );
  }
  let lo = 0;
  let hi = max;
  let rHi = rMax;
  while (hi - lo > tol) {
    const mid = 0.5 * (lo + hi);
    const r = scenario.run(planOf(mid));
    if (ok(r)) {
      hi = mid;
      rHi = r;
    } else lo = mid;
  }
  return result(
    'ok',
    hi,
    rHi,
    `opening ${hi.toFixed(3)} keeps the peak at ${rHi.peakElevation.toFixed(3)} m`,
  );
}
