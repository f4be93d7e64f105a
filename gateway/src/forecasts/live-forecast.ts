import {
  createStorageCurve,
  prepareScenario,
  routeStorageIndication,
  runEnsemble,
  timeToThresholds,
  type FlowPoint,
  type OutletSettings,
  type RoutingOptions,
} from '@stillwell/shared/hydraulics';
import type {
  ForecastInputs,
  ForecastPeak,
  ForecastSeries,
  HoldNow,
  ThresholdOutlook,
  TimeLeft,
} from '@stillwell/shared/forecasts';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { decideHoldNow, decideTimeLeft, type LookbackRun } from './decisions';
import type { ForecastOptions } from './forecast-settings';
import { chooseInflowForecast } from './inflow-method';
import { forecastLevels, freeboardTarget, standardPlanGates } from './levels';

/** What the gateway knows at the moment of a run (gathered by ForecastInputsService). */
export interface ForecastState {
  nowMs: number;
  pool: { elevation: number; source: string };
  openings: OutletSettings;
  /** controls without a usable reading (taken as closed) */
  assumedClosed: string[];
  tailwater: number | null;
  /** good inflow readings, t in epoch s, oldest first */
  observedInflow: FlowPoint[];
  /** the pool and openings observed about `lookbackS` ago, for the "too late" check */
  lookback: { atMs: number; elevation: number; openings: OutletSettings } | null;
  notes: string[];
}

export interface ComputedForecast {
  inputs: ForecastInputs;
  series: ForecastSeries;
  peak: ForecastPeak;
  thresholds: ThresholdOutlook[];
  timeLeft: TimeLeft;
  holdNow: HoldNow;
  notes: string[];
}

/** A run that cannot be made from what is known (the reason goes to the operator as it is). */
export class ForecastInputError extends Error {}

const mm = (v: number) => Math.round(v * 1000) / 1000;
const cs = (v: number) => Math.round(v * 100) / 100;

/** Every `stride`-th value, n values, the last one repeated where the array is shorter. */
function every(a: ArrayLike<number>, stride: number, n: number, round: (v: number) => number) {
  const out: number[] = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = round(a[Math.min(i * stride, a.length - 1)]!);
  return out;
}

/**
 * One live forecast: the inflow forecast chosen from the record, the deterministic run with the
 * gates held where they are, an ensemble of inflow scenarios around it, and the decisions (time
 * to each level, time left to act on the standard plan, the smallest opening that holds the
 * target now). Pure: the same state, options and seed give the same answer.
 */
export function computeForecast(
  def: ReservoirDefinition,
  state: ForecastState,
  o: ForecastOptions,
  seed: string,
): ComputedForecast {
  const storage = createStorageCurve(def.storageTable);
  const pool = state.pool.elevation;
  if (!(pool >= storage.minElevation && pool <= storage.maxElevation)) {
    throw new ForecastInputError(
      `the pool reading ${pool.toFixed(2)} m is outside the storage table (${storage.minElevation} to ${storage.maxElevation} m)`,
    );
  }
  const nowS = state.nowMs / 1000;
  let chosen;
  try {
    chosen = chooseInflowForecast(state.observedInflow, nowS, o);
  } catch (error) {
    throw new ForecastInputError(`no inflow forecast: ${(error as Error).message}`);
  }
  const inflow = { t: chosen.t, q: chosen.q };
  const base: RoutingOptions = {
    storage,
    structures: def.structures,
    inflow,
    initialElevation: pool,
    initialSettings: state.openings,
    start: nowS,
    duration: o.horizonS,
    dt: o.dtS,
    tailwater: state.tailwater ?? undefined,
    // Beyond the table the model knows nothing: stop there and report it, never extrapolate.
    aboveTable: 'stop',
  };
  const levels = forecastLevels(def);
  const det = routeStorageIndication(base);
  const ens = runEnsemble({
    ...base,
    dt: o.ensemble.dtS,
    members: o.ensemble.members,
    seed,
    spread: {
      sigma: o.ensemble.sigma,
      growth: o.ensemble.growthS,
      correlation: o.ensemble.correlationS,
      interval: o.ensemble.intervalS,
    },
    thresholds: levels,
  });
  const target = freeboardTarget(def);
  const plan = standardPlanGates(def, o.planOpeningFraction);
  const scenario = prepareScenario(base);
  const timeLeft = decideTimeLeft(
    base,
    scenario,
    target,
    plan,
    def.timeZone,
    lookbackRun(state, inflow, nowS, o.dtS),
  );
  const holdNow = decideHoldNow(base, scenario, target, plan);

  const n = Math.round(o.horizonS / o.outputStepS) + 1;
  const detStride = Math.round(o.outputStepS / o.dtS);
  const ensStride = Math.round(o.outputStepS / o.ensemble.dtS);
  const band = (p: number) => every(ens.band(p)!, ensStride, n, mm);
  const series: ForecastSeries = {
    startMs: state.nowMs,
    stepS: o.outputStepS,
    inflow: every(chosen.q, detStride, n, cs),
    elevation: every(det.elevation, detStride, n, mm),
    outflow: every(det.outflow, detStride, n, cs),
    p10: band(0.1),
    p50: band(0.5),
    p90: band(0.9),
  };
  const crossings = timeToThresholds(det, levels);
  const thresholds: ThresholdOutlook[] = levels.map((level, i) => {
    const c = crossings[i]!;
    return {
      id: level.id,
      label: level.label,
      kind: level.kind,
      elevation: level.elevation,
      timeMs: c.time === null ? null : Math.round(c.time * 1000),
      leadS: c.leadTime,
      alreadyAbove: c.alreadyAbove,
      timeAboveS: c.timeAbove,
      probability: ens.exceedance[i]?.probability ?? 0,
    };
  });
  const notes = [...state.notes, ...chosen.notes];
  if (det.leftTableAt !== null)
    notes.push(
      `the pool leaves the top of the storage table (${storage.maxElevation} m): the model stops there and does not model overtopping; the peak shown is a lower bound`,
    );
  if (ens.membersAboveTable > 0)
    notes.push(
      `${ens.membersAboveTable} of ${ens.members} ensemble members leave the storage table: the upper band there is a lower bound`,
    );
  notes.push('the ensemble spread uses judgement defaults, not calibrated against past forecasts');
  return {
    inputs: {
      siteNowMs: state.nowMs,
      startElevation: pool,
      poolSource: state.pool.source,
      openings: { ...state.openings.gates, ...state.openings.valves },
      assumedClosed: state.assumedClosed,
      tailwater: state.tailwater,
      inflow: {
        method: chosen.method,
        reason: chosen.reason,
        nowFlow: chosen.nowFlow,
        parameters: chosen.parameters,
        notes: chosen.notes,
        observedPoints: state.observedInflow.length,
        observedFromMs: state.observedInflow.length ? state.observedInflow[0]!.t * 1000 : null,
      },
      horizonS: o.horizonS,
      dtS: o.dtS,
      ensemble: {
        members: o.ensemble.members,
        seed,
        dtS: o.ensemble.dtS,
        sigma: o.ensemble.sigma,
        growthS: o.ensemble.growthS,
        correlationS: o.ensemble.correlationS,
        intervalS: o.ensemble.intervalS,
      },
    },
    series,
    peak: {
      elevation: det.peakElevation,
      timeMs: Math.round(det.peakElevationTime * 1000),
      outflow: det.peakOutflow,
      outflowTimeMs: Math.round(det.peakOutflowTime * 1000),
      leftTableAtMs: det.leftTableAt === null ? null : Math.round(det.leftTableAt * 1000),
      p10: ens.peakElevation[0]!,
      p50: ens.peakElevation[1]!,
      p90: ens.peakElevation[2]!,
      membersAboveTable: ens.membersAboveTable,
    },
    thresholds,
    timeLeft,
    holdNow,
    notes,
  };
}

/** The look-back replay: observed inflow from the look-back state until now, the forecast after. */
function lookbackRun(
  state: ForecastState,
  forecast: { t: Float64Array; q: Float64Array },
  nowS: number,
  dtS: number,
): LookbackRun | null {
  const lb = state.lookback;
  if (!lb) return null;
  // a whole number of steps before now, so that the plan's starts fall on the live run's grid
  const steps = Math.round((nowS - lb.atMs / 1000) / dtS);
  if (steps < 1) return null;
  const startS = nowS - steps * dtS;
  const past = state.observedInflow.filter((p) => p.t < nowS);
  if (past.length === 0) return null;
  const t = [...past.map((p) => p.t), ...forecast.t];
  const q = [...past.map((p) => p.q), ...forecast.q];
  return {
    startS,
    elevation: lb.elevation,
    openings: lb.openings,
    inflow: { t: Float64Array.from(t), q: Float64Array.from(q) },
  };
}
