import type { ForecastOutlook } from '@stillwell/shared/alarms';
import {
  createStorageCurve,
  latestStart,
  leastSquaresSlope,
  linearTrendForecast,
  persistenceForecast,
  prepareScenario,
  routeStorageIndication,
  timeToThresholds,
  type FlowPoint,
  type OutletSettings,
  type RoutingOptions,
  type StorageCurve,
} from '@stillwell/shared/hydraulics';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';

/**
 * A plain forecast outlook for headless alarm runs, built the way the gateway's live forecast
 * builds its own (gateway/src/forecasts): the inflow trend of the last 3 h continued for 3 h and
 * then held (persistence when not rising), routed for 24 h with the gates as measured; "time left"
 * for the standard plan (every spillway gate fully open) to keep the peak at the crest less the
 * freeboard. No ensemble and no look-back: enough to judge the forecast alarms from a run.
 */
export interface OutlookInputs {
  nowMs: number;
  pool: number;
  /** measured inflow, times in ms */
  inflow: readonly { t: number; v: number }[];
  openings: OutletSettings;
  tailwater: number | null;
}

const HORIZON_S = 24 * 3600;
const DT_S = 300;
const TREND_S = 3 * 3600;
/** rising: a slope above 2 % of the flow per hour (and 1 m3/s per hour), as the live forecast */
const RISING_FRACTION_PER_H = 0.02;

export class OutlookMaker {
  private readonly curve: StorageCurve;

  constructor(private readonly reservoir: ReservoirDefinition) {
    this.curve = createStorageCurve(reservoir.storageTable);
  }

  make(i: OutlookInputs): ForecastOutlook | null {
    const nowS = i.nowMs / 1000;
    const observed: FlowPoint[] = i.inflow.map((p) => ({ t: p.t / 1000, q: p.v }));
    if (observed.length < 3) return null;
    const grid = { now: nowS, horizon: HORIZON_S, dt: DT_S };
    const recent = observed.filter((p) => p.t >= nowS - TREND_S);
    const slope =
      recent.length >= 3
        ? leastSquaresSlope(
            recent.map((p) => p.t),
            recent.map((p) => p.q),
          ).slope * 3600
        : 0;
    const nowFlow = observed[observed.length - 1]!.q;
    const rising = slope > Math.max(RISING_FRACTION_PER_H * nowFlow, 1);
    const inflow = rising
      ? linearTrendForecast(observed, { ...grid, window: TREND_S })
      : persistenceForecast(observed, grid);
    if (rising) {
      const hold = Math.round(TREND_S / DT_S);
      for (let k = hold + 1; k < inflow.q.length; k++)
        (inflow.q as Float64Array)[k] = inflow.q[hold]!;
    }
    const options: RoutingOptions = {
      storage: this.curve,
      structures: this.reservoir.structures,
      inflow,
      initialElevation: Math.min(i.pool, this.curve.maxElevation),
      initialSettings: i.openings,
      start: nowS,
      duration: HORIZON_S,
      dt: DT_S,
      tailwater: i.tailwater ?? undefined,
      aboveTable: 'stop',
    };
    const base = routeStorageIndication(options);
    const crossings = timeToThresholds(base, this.reservoir.thresholds);
    const scenario = prepareScenario(options);
    const target =
      this.reservoir.thresholds.find((t) => t.kind === 'crest-less-freeboard')?.elevation ??
      this.reservoir.damCrestElevation - this.reservoir.requiredFreeboard;
    const gates = this.reservoir.structures.flatMap((s) =>
      s.kind === 'gated-spillway' ? s.gates : [],
    );
    const plan = gates.map((g) => ({ time: 0, id: g.id, target: g.maxOpening }));
    const tl = latestStart(options, { plan, target, now: nowS }, scenario);
    return {
      computedAtMs: i.nowMs,
      peak: { elevation: base.peakElevation },
      thresholds: crossings.map((c) => ({
        id: c.id,
        elevation: c.elevation,
        timeMs: c.time === null ? null : c.time * 1000,
        alreadyAbove: c.alreadyAbove,
      })),
      timeLeft: {
        status: tl.status,
        timeLeftS: tl.status === 'ok' ? tl.timeLeft : null,
      },
    };
  }
}
