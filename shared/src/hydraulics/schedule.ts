import type { OutflowModel } from './outflow-model.js';

/**
 * A gate schedule: from `time` (s, same clock as the inflow) the gate or valve `id` moves towards
 * `target` (m for a gate, % for a valve) at its travel speed, until a later entry for the same id
 * replaces the target. Entries may come in any order; equal times for one id: the last one wins.
 */
export interface ScheduleEntry {
  time: number;
  id: string;
  target: number;
}
export type GateSchedule = readonly ScheduleEntry[];

/** Per control: change times and targets, sorted by time. */
export interface CompiledSchedule {
  times: Float64Array[];
  targets: Float64Array[];
  speeds: Float64Array;
}

/** Problems in a schedule, as messages naming the entry (counted from 1). */
export function validateSchedule(model: OutflowModel, schedule: GateSchedule): string[] {
  const out: string[] = [];
  schedule.forEach((e, i) => {
    const k = model.indexOf(e.id);
    const where = `schedule entry ${i + 1} (${e.id})`;
    if (k < 0) out.push(`${where}: no gate or valve with this id`);
    else {
      const c = model.controls[k]!;
      const unit = c.kind === 'gate' ? 'm' : '%';
      if (!Number.isFinite(e.target) || e.target < 0 || e.target > c.max) {
        out.push(`${where}: target ${e.target} ${unit} is outside 0..${c.max} ${unit}`);
      }
    }
    if (!Number.isFinite(e.time)) out.push(`${where}: time must be a finite number of seconds`);
  });
  return out;
}

export function compileSchedule(
  model: OutflowModel,
  schedule: GateSchedule,
  shift = 0,
): CompiledSchedule {
  const problems = validateSchedule(model, schedule);
  if (problems.length > 0) throw new RangeError(problems.join('; '));
  const per = model.controls.map(() => [] as { time: number; target: number; order: number }[]);
  schedule.forEach((e, order) =>
    per[model.indexOf(e.id)]!.push({ time: e.time + shift, target: e.target, order }),
  );
  for (const list of per) list.sort((a, b) => a.time - b.time || a.order - b.order);
  return {
    times: per.map((l) => Float64Array.from(l, (e) => e.time)),
    targets: per.map((l) => Float64Array.from(l, (e) => e.target)),
    speeds: Float64Array.from(model.controls, (c) => c.speed),
  };
}

/** Moves x towards target at speed for a duration (exact). */
function moveToward(x: number, target: number, speed: number, duration: number): number {
  const step = speed * duration;
  if (target > x) return target - x <= step ? target : x + step;
  return x - target <= step ? target : x - step;
}

/**
 * Opening of control k at t1 given its opening x at t0 (t0 < t1): follows the schedule's target
 * changes inside (t0, t1] exactly. Before the first entry the control holds still.
 */
export function advanceControl(
  plan: CompiledSchedule,
  k: number,
  x: number,
  t0: number,
  t1: number,
): number {
  const times = plan.times[k]!;
  const targets = plan.targets[k]!;
  const n = times.length;
  if (n === 0 || t1 <= times[0]!) return x;
  const speed = plan.speeds[k]!;
  // last entry at or before t0
  let i = -1;
  let lo = 0;
  let hi = n - 1;
  if (times[0]! <= t0) {
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (times[mid]! <= t0) lo = mid;
      else hi = mid - 1;
    }
    i = lo;
  }
  let t = t0;
  let target = i >= 0 ? targets[i]! : x;
  let j = i + 1;
  while (j < n && times[j]! <= t1) {
    x = moveToward(x, target, speed, times[j]! - t);
    t = times[j]!;
    target = targets[j]!;
    j++;
  }
  return moveToward(x, target, speed, t1 - t);
}

/**
 * Until when control k, at opening x at time t, is sure to stay still: the next schedule entry
 * after t if x is already at the target in force at t (or no entry applies yet), else t.
 */
export function stillUntil(plan: CompiledSchedule, k: number, x: number, t: number): number {
  const times = plan.times[k]!;
  const n = times.length;
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (times[mid]! <= t) lo = mid + 1;
    else hi = mid;
  }
  // lo = index of the first entry after t
  const target = lo > 0 ? plan.targets[k]![lo - 1]! : x;
  if (target !== x) return t;
  return lo < n ? times[lo]! : Infinity;
}

/** Piecewise-linear opening trajectories: per control, breakpoint times and values. */
export interface OpeningTrajectory {
  times: Float64Array[];
  values: Float64Array[];
}

/** The exact (unthrottled) trajectories of a schedule from initial openings at t0 until t1. */
export function scheduleTrajectory(
  plan: CompiledSchedule,
  initial: Float64Array,
  t0: number,
  t1: number,
): OpeningTrajectory {
  const times: Float64Array[] = [];
  const values: Float64Array[] = [];
  for (let k = 0; k < initial.length; k++) {
    const ts = [t0];
    const vs = [initial[k]!];
    const events = Array.from(plan.times[k]!).filter((t) => t > t0 && t < t1);
    let x = initial[k]!;
    let t = t0;
    for (const te of [...events, t1]) {
      // the control may arrive at its target between two events: add that corner
      const target = targetAt(plan, k, t, x);
      const arrive = t + Math.abs(target - x) / plan.speeds[k]!;
      if (arrive > t && arrive < te) {
        ts.push(arrive);
        vs.push(target);
      }
      x = advanceControl(plan, k, x, t, te);
      t = te;
      ts.push(te);
      vs.push(x);
    }
    times.push(Float64Array.from(ts));
    values.push(Float64Array.from(vs));
  }
  return { times, values };
}

function targetAt(plan: CompiledSchedule, k: number, t: number, hold: number): number {
  const times = plan.times[k]!;
  let target = hold;
  for (let i = 0; i < times.length && times[i]! <= t; i++) target = plan.targets[k]![i]!;
  return target;
}

/** Evaluates every control's opening at t into out (linear between breakpoints, held outside). */
export function trajectoryAt(traj: OpeningTrajectory, t: number, out: Float64Array): Float64Array {
  for (let k = 0; k < traj.times.length; k++) {
    const ts = traj.times[k]!;
    const vs = traj.values[k]!;
    const n = ts.length;
    if (t <= ts[0]!) out[k] = vs[0]!;
    else if (t >= ts[n - 1]!) out[k] = vs[n - 1]!;
    else {
      let lo = 0;
      let hi = n - 1;
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        if (ts[mid]! <= t) lo = mid;
        else hi = mid;
      }
      const w = (t - ts[lo]!) / (ts[hi]! - ts[lo]!);
      out[k] = vs[lo]! + w * (vs[hi]! - vs[lo]!);
    }
  }
  return out;
}

/** Every breakpoint time of a trajectory (sorted, unique): where the outflow may have a kink. */
export function trajectoryBreakpoints(traj: OpeningTrajectory): number[] {
  const all = new Set<number>();
  for (const ts of traj.times) for (const t of ts) all.add(t);
  return [...all].sort((a, b) => a - b);
}
