import {
  latestStart,
  smallestOpening,
  type FlowSeries,
  type OutletSettings,
  type RoutingOptions,
  type Scenario,
} from '@stillwell/shared/hydraulics';
import type { HoldNow, TimeLeft } from '@stillwell/shared/forecasts';
import type { Level } from './levels';
import { durationText, metres, siteTimeText } from './time-text';

export interface PlanSpec {
  gates: string[];
  opening: number;
  maxOpening: number;
}

/** A state observed some hours ago, from which the "too late" check replays the record. */
export interface LookbackRun {
  startS: number;
  elevation: number;
  openings: OutletSettings;
  /** observed inflow up to now, then the forecast */
  inflow: FlowSeries;
}

const planLabel = (p: PlanSpec) =>
  p.opening >= p.maxOpening
    ? `open all ${p.gates.length} spillway gates fully (${metres(p.opening)})`
    : `open all ${p.gates.length} spillway gates to ${metres(p.opening)}`;

/**
 * "Time left to act" for the standard plan. The live run starts now, so it can only say "start by
 * ..." or "even started now it fails". To tell "too late" (it would have worked had it started
 * earlier) from "impossible" (it would not have worked at all) the record is replayed from the
 * look-back state with the plan started at any step since then.
 */
export function decideTimeLeft(
  base: RoutingOptions,
  scenario: Scenario,
  target: Level,
  plan: PlanSpec,
  timeZone: string,
  lookback: LookbackRun | null,
): TimeLeft {
  const nowS = base.start!;
  const at = (s: number) => siteTimeText(s * 1000, timeZone);
  const common = {
    target: target.elevation,
    targetLabel: target.label,
    plan: { label: planLabel(plan), gates: plan.gates, opening: plan.opening },
  };
  const entries = plan.gates.map((id) => ({ time: 0, id, target: plan.opening }));
  if (entries.length === 0) {
    const r = scenario.run([]);
    const fine = !r.leftTable && r.peakElevation <= target.elevation;
    return {
      ...common,
      status: fine ? 'not-needed' : 'impossible',
      latestStartMs: null,
      timeLeftS: null,
      peakAtLatest: null,
      peakIfStartedNow: null,
      peakWithoutPlan: r.peakElevation,
      message: fine
        ? `the forecast peak ${metres(r.peakElevation)} stays below ${target.label}`
        : 'the reservoir has no spillway gates for a standard plan',
    };
  }
  const r = latestStart(base, { plan: entries, target: target.elevation, now: nowS }, scenario);
  const label = common.plan.label;
  const result = (status: TimeLeft['status'], message: string, from = r): TimeLeft => ({
    ...common,
    status,
    latestStartMs: from.latestStart === null ? null : from.latestStart * 1000,
    timeLeftS: from.latestStart === null ? null : from.latestStart - nowS,
    peakAtLatest: from.peakAtLatest,
    peakIfStartedNow: r.peakIfStartedNow,
    peakWithoutPlan: r.peakWithoutPlan,
    message,
  });
  switch (r.status) {
    case 'not-needed':
      return result(
        'not-needed',
        `no action needed for ${target.label}: with the gates as they are the forecast peak is ${metres(r.peakWithoutPlan)}, below ${metres(target.elevation)}`,
      );
    case 'ok':
    case 'past': {
      // a start at the very end of the horizon means the horizon, not the storm, set the limit
      const atEnd = r.latestStart! >= nowS + base.duration - 1e-6;
      return result(
        'ok',
        `${label} by ${at(r.latestStart!)} (${durationText(r.latestStart! - nowS)} from now${atEnd ? ', the end of the forecast horizon: perhaps later' : ''}) to keep the peak at or below ${target.label} (${metres(target.elevation)})`,
      );
    }
    case 'impossible': {
      const earlier = lookback ? replay(base, lookback, entries, target, nowS) : null;
      if (earlier && earlier.status === 'past' && earlier.latestStart !== null) {
        return result(
          'past',
          `too late for the standard plan: it had to start by ${at(earlier.latestStart)}, ${durationText(nowS - earlier.latestStart)} ago; started now the peak is ${metres(r.peakIfStartedNow)}, above ${target.label} (${metres(target.elevation)})`,
          earlier,
        );
      }
      return result(
        'impossible',
        `even started now, ${label} gives a peak of ${metres(r.peakIfStartedNow)}, above ${target.label} (${metres(target.elevation)}): a larger plan is needed`,
      );
    }
  }
}

function replay(
  base: RoutingOptions,
  lb: LookbackRun,
  plan: { time: number; id: string; target: number }[],
  target: Level,
  nowS: number,
) {
  const options: RoutingOptions = {
    ...base,
    inflow: lb.inflow,
    initialElevation: lb.elevation,
    initialSettings: lb.openings,
    start: lb.startS,
    duration: base.duration + (nowS - lb.startS),
  };
  try {
    return latestStart(options, { plan, target: target.elevation, now: nowS });
  } catch {
    // a look-back state outside the storage table and the like: no replay, say "impossible"
    return null;
  }
}

/** The smallest common opening of the plan's gates, commanded now, that keeps the target. */
export function decideHoldNow(
  base: RoutingOptions,
  scenario: Scenario,
  target: Level,
  plan: PlanSpec,
): HoldNow {
  const nowS = base.start!;
  if (plan.gates.length === 0) {
    const r = scenario.run([]);
    return {
      status: !r.leftTable && r.peakElevation <= target.elevation ? 'not-needed' : 'impossible',
      target: target.elevation,
      gates: [],
      opening: null,
      maxOpening: 0,
      peakElevation: r.peakElevation,
      peakTimeMs: (nowS + r.peakElevationIndex * base.dt) * 1000,
      message: 'the reservoir has no spillway gates',
    };
  }
  const r = smallestOpening(
    base,
    { ids: plan.gates, target: target.elevation, start: nowS },
    scenario,
  );
  const message =
    r.status === 'ok'
      ? `opening every spillway gate to ${metres(r.opening!)} now keeps the peak at ${metres(r.peakElevation)}, within ${target.label}`
      : r.status === 'not-needed'
        ? `even with every spillway gate shut the peak stays at or below ${target.label}`
        : `even fully open now the gates leave a peak of ${metres(r.peakElevation)}, above ${target.label}`;
  return {
    status: r.status,
    target: target.elevation,
    gates: plan.gates,
    opening: r.opening,
    maxOpening: plan.maxOpening,
    peakElevation: r.peakElevation,
    peakTimeMs: r.peakTime * 1000,
    message,
  };
}
