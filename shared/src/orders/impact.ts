import { compareSchedules } from '../hydraulics/decisions/compare.js';
import type { FlowSeries } from '../hydraulics/inflow-series.js';
import type { ScheduleEntry } from '../hydraulics/schedule.js';
import { createStorageCurve } from '../hydraulics/storage-curve.js';
import type { ReservoirDefinition } from '../reservoirs/definition.js';
import type { OrderImpact, OrderStep } from './api.js';
import { controlsOf } from './controls.js';
import { releaseAt, releaseRamp, settingsOf, type Openings } from './release.js';

export interface ImpactInput {
  definition: ReservoirDefinition;
  /** pool elevation now, m */
  pool: number;
  /** reported openings now, by control id */
  openings: Openings;
  steps: readonly OrderStep[];
  /** inflow now, m3/s (held constant when no forecast is given); null when unknown */
  inflow: number | null;
  /** an inflow forecast, t in s from now; overrides the constant inflow */
  forecast?: { series: FlowSeries; label: string };
  /** default 24 h */
  horizonH?: number;
}

/** The openings once every step has been carried out. */
export function finalOpenings(current: Openings, steps: readonly OrderStep[]): Openings {
  const out: Record<string, number> = { ...current };
  for (const step of steps) for (const t of step.targets) out[t.control] = t.target;
  return out;
}

/**
 * The routed effect of a draft: the release now and after the order, the steepest change of
 * release while the first step travels, and the forecast peak pool with and without the order
 * (level-pool routing from the present pool). The same function runs in the console before the
 * draft is submitted and in the gateway when it is stored, so both show the same figures.
 * Decision support only: the approved operating rules and the duty engineer prevail.
 */
export function orderImpact(input: ImpactInput): OrderImpact {
  const { definition, pool, openings, steps } = input;
  const horizonH = input.horizonH ?? 24;
  const controls = controlsOf(definition);
  const finalSet = finalOpenings(openings, steps);
  const currentRelease = releaseAt(definition, controls, pool, openings);
  const expectedRelease = releaseAt(definition, controls, pool, finalSet);
  const first = steps[0];
  const ramp = first
    ? releaseRamp(
        definition,
        controls,
        pool,
        openings,
        Object.fromEntries(first.targets.map((t) => [t.control, t.target])),
      )
    : null;
  const notes: string[] = [];
  let basis: string;
  let inflow: FlowSeries | null = null;
  if (input.forecast) {
    basis = input.forecast.label;
    inflow = input.forecast.series;
  } else if (input.inflow !== null) {
    basis = `inflow held at its present ${input.inflow.toFixed(0)} m3/s (no forecast run attached)`;
    inflow = { t: [0, horizonH * 3600], q: [input.inflow, input.inflow] };
    notes.push(
      'a constant inflow knows nothing of the coming peak; use the forecast when there is one',
    );
  } else {
    basis = 'no inflow reading: the routed effect cannot be computed';
  }
  let peakWithout: OrderImpact['peakWithout'] = null;
  let peakWith: OrderImpact['peakWith'] = null;
  if (inflow) {
    try {
      const schedule: ScheduleEntry[] = steps.flatMap((s) =>
        s.targets.map((t) => ({ time: s.offsetMin * 60, id: t.control, target: t.target })),
      );
      const cmp = compareSchedules(
        {
          storage: createStorageCurve(definition.storageTable),
          structures: definition.structures,
          inflow,
          initialElevation: pool,
          initialSettings: settingsOf(controls, openings),
          start: 0,
          duration: horizonH * 3600,
          dt: 60,
        },
        [],
        schedule,
      );
      peakWithout = { elevation: cmp.a.peakElevation, afterS: cmp.a.peakElevationTime };
      peakWith = { elevation: cmp.b.peakElevation, afterS: cmp.b.peakElevationTime };
      if (cmp.a.leftTableAt !== null || cmp.b.leftTableAt !== null)
        notes.push(
          'the pool leaves the storage table within the horizon: the peak is a lower bound',
        );
    } catch (error) {
      notes.push(`routing failed: ${(error as Error).message}`);
    }
  }
  return {
    basis,
    pool,
    inflow: input.inflow,
    currentRelease,
    expectedRelease,
    releaseChange: expectedRelease - currentRelease,
    steepestRatePerMin: ramp?.steepestPerMin ?? 0,
    horizonH,
    peakWithout,
    peakWith,
    notes,
  };
}
