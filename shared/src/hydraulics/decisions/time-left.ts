import type { RoutingOptions } from '../routing-types.js';
import type { GateSchedule } from '../schedule.js';
import type { PulsSummary } from '../puls-core.js';
import { prepareScenario } from './search.js';

export interface LatestStartSearch {
  /** the plan, entry times relative to its start (0 = the moment the operator starts it) */
  plan: GateSchedule;
  /** the peak pool level must not exceed this, m */
  target: number;
  /** the present, s (default: the run start) */
  now?: number;
  /**
   * earliest start considered, s (default: the run start). A run that begins in the past (from an
   * observed state) can place it before `now` and so tell how long ago the chance was lost.
   */
  earliest?: number;
  /** latest start considered, s (default: the end of the run) */
  latest?: number;
}

export interface LatestStartResult {
  /**
   * ok: starting by `latestStart` (>= now) keeps the peak at or below the target;
   * past: it would have had to start by `latestStart`, before now: starting now is too late;
   * impossible: even starting at `earliest` the plan does not keep the peak down;
   * not-needed: the peak stays at or below the target without the plan.
   */
  status: 'ok' | 'past' | 'impossible' | 'not-needed';
  latestStart: number | null;
  /** latestStart - now, s (negative when past) */
  timeLeft: number | null;
  peakAtLatest: number | null;
  /** peak if started one step after latestStart (null if that is outside the window) */
  peakOneStepLater: number | null;
  peakIfStartedNow: number;
  peakWithoutPlan: number;
  runs: number;
  message: string;
}

const hours = (s: number) => `${(s / 3600).toFixed(2)} h`;

/**
 * "Time left to act": the latest start time (on the step grid) of a plan that still keeps the peak
 * at or below the target. Binary search on the start step, keeping a start that works (lo) and one
 * that does not (hi) one step apart at the end: valid because starting later never lowers the
 * peak for a plan that opens outlets; the answer is verified either side whatever the monotonicity.
 */
export function latestStart(
  o: RoutingOptions,
  q: LatestStartSearch,
  scenario = prepareScenario(o),
): LatestStartResult {
  const { t0, dt, steps } = scenario.ctx;
  const runs0 = scenario.runs;
  const now = q.now ?? t0;
  const kMin = Math.max(0, Math.ceil(((q.earliest ?? t0) - t0) / dt - 1e-9));
  const kMax = Math.min(steps, Math.floor(((q.latest ?? t0 + steps * dt) - t0) / dt + 1e-9));
  if (kMin > kMax) throw new RangeError('the search window is empty (earliest after latest)');
  const kNow = Math.min(kMax, Math.max(kMin, Math.ceil((now - t0) / dt - 1e-9)));
  const memo = new Map<number, PulsSummary>();
  const at = (k: number) => {
    let r = memo.get(k);
    if (!r) {
      r = scenario.run(q.plan.map((e) => ({ ...e, time: e.time + t0 + k * dt })));
      memo.set(k, r);
    }
    return r;
  };
  const ok = (r: PulsSummary) => !r.leftTable && r.peakElevation <= q.target;
  const peak = (r: PulsSummary) => r.peakElevation;
  const without = scenario.run([]);
  const base = {
    peakIfStartedNow: peak(at(kNow)),
    peakWithoutPlan: peak(without),
  };
  const done = (
    status: LatestStartResult['status'],
    k: number | null,
    message: string,
  ): LatestStartResult => ({
    status,
    latestStart: k === null ? null : t0 + k * dt,
    timeLeft: k === null ? null : t0 + k * dt - now,
    peakAtLatest: k === null ? null : peak(at(k)),
    peakOneStepLater: k === null || k + 1 > steps ? null : peak(at(k + 1)),
    ...base,
    runs: scenario.runs - runs0,
    message,
  });
  if (ok(without)) {
    return done(
      'not-needed',
      null,
      `without the plan the peak is ${peak(without).toFixed(3)} m, within ${q.target} m`,
    );
  }
  if (!ok(at(kMin))) {
    return done(
      'impossible',
      null,
      `even started at ${hours(t0 + kMin * dt)} the plan gives a peak of ${peak(at(kMin)).toFixed(3)} m, above ${q.target} m: a larger plan is needed`,
    );
  }
  let lo = kMin;
  let hi = kMax + 1; // a start after the window counts as failing
  if (ok(at(kMax))) lo = kMax;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (ok(at(mid))) lo = mid;
    else hi = mid;
  }
  const latest = t0 + lo * dt;
  if (latest < now) {
    return done(
      'past',
      lo,
      `too late: the plan had to start by ${hours(latest)}, ${hours(now - latest)} ago; started now the peak is ${base.peakIfStartedNow.toFixed(3)} m`,
    );
  }
  return done(
    'ok',
    lo,
    `start the plan by ${hours(latest)} (${hours(latest - now)} from now) to keep the peak at or below ${q.target} m`,
  );
}
