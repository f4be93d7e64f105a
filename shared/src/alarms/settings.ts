import type { ReservoirDefinition, ThresholdKind } from '../reservoirs/definition.js';
import type {
  FrozenCheck,
  ForecastLimits,
  GaugeDisagreementLimits,
  MassBalanceLimits,
  OutOfRangeLimits,
  PiezometerLimits,
  PoolLevelAlarm,
  RateOfRiseLimits,
  SeepageLimits,
} from './limits.js';
import type { Priority } from './priorities.js';

/**
 * The defaults for every alarm section a definition leaves out. docs/alarms.md gives the reason for
 * each figure; change them together.
 */
export const DEFAULT_RATE_OF_RISE: RateOfRiseLimits = {
  limit: 0.3,
  windowS: 1800,
  deadband: 0.05,
  onDelayS: 600,
  firstFilling: { active: false, limit: 0.02, windowS: 21600 },
};

export const DEFAULT_GAUGE_DISAGREEMENT: GaugeDisagreementLimits = {
  tolerance: 0.1,
  deadband: 0.03,
  windowS: 600,
  onDelayS: 600,
};

export const DEFAULT_OUT_OF_RANGE: OutOfRangeLimits = { count: 3, windowS: 600, clearAfterS: 1800 };

export const DEFAULT_MASS_BALANCE: MassBalanceLimits = {
  windowS: 10800,
  endAverageS: 900,
  toleranceFlow: 1,
  toleranceFraction: 0.02,
  clearFraction: 0.75,
  onDelayS: 3600,
  maxGapS: 900,
  everyS: 300,
};

export const DEFAULT_FORECAST_CLEAR_AFTER_S = 1800;

export const DEFAULT_FORECAST: Omit<ForecastLimits, 'thresholds'> = {
  horizonS: 43200,
  timeLeftMarginS: 10800,
  timeLeftDeadbandS: 900,
  clearAfterS: DEFAULT_FORECAST_CLEAR_AFTER_S,
};

export const DEFAULT_SEEPAGE: SeepageLimits = { onDelayS: 1800, deadbandFraction: 0.1 };
export const DEFAULT_PIEZOMETERS: PiezometerLimits = { onDelayS: 900, deadband: 0.1 };
export const DEFAULT_SHELVE_MAX_S = 43200;
export const DEFAULT_POOL_DEADBAND = 0.05;
export const DEFAULT_POOL_ON_DELAY_S = 120;

/** Priority of a pool threshold the definition does not list, by what the threshold is. */
export const POOL_PRIORITY_BY_KIND: Readonly<Record<ThresholdKind, Priority>> = {
  alert: 'advisory',
  'spillway-crest': 'advisory',
  'auxiliary-spillway': 'prompt',
  'crest-less-freeboard': 'immediate',
  'dam-crest': 'immediate',
};

/** Frozen checks for channels that always move a little when healthy, by role. */
const FROZEN_BY_ROLE: Readonly<Record<string, { band: number; afterS: number }>> = {
  pool: { band: 0.002, afterS: 1800 },
  inflow: { band: 0.05, afterS: 3600 },
  outflow: { band: 0.05, afterS: 3600 },
  tailwater: { band: 0.002, afterS: 3600 },
  'seepage-weir-head': { band: 0.0002, afterS: 7200 },
  piezometer: { band: 0.002, afterS: 7200 },
};

export interface AlarmSettings {
  poolLevels: PoolLevelAlarm[];
  rateOfRise: RateOfRiseLimits;
  gaugeDisagreement: GaugeDisagreementLimits;
  frozen: FrozenCheck[];
  outOfRange: OutOfRangeLimits;
  massBalance: MassBalanceLimits;
  forecast: ForecastLimits;
  seepage: SeepageLimits;
  piezometers: PiezometerLimits;
  shelveMaxS: number;
}

/** The definition's limits with the defaults filled in. */
export function alarmSettingsOf(def: ReservoirDefinition): AlarmSettings {
  const a = def.alarms ?? {};
  const listed = new Map((a.poolLevels ?? []).map((p) => [p.thresholdId, p]));
  const poolLevels = def.thresholds.map(
    (t) =>
      listed.get(t.id) ?? {
        thresholdId: t.id,
        priority: POOL_PRIORITY_BY_KIND[t.kind],
        deadband: DEFAULT_POOL_DEADBAND,
        onDelayS: DEFAULT_POOL_ON_DELAY_S,
      },
  );
  // Rain and gate positions may rightly sit still for days: no frozen check by default.
  const frozen =
    a.frozen ??
    def.channels.flatMap((c) => {
      const d = FROZEN_BY_ROLE[c.role];
      return d ? [{ channel: c.id, ...d }] : [];
    });
  const defaultForecastLevels = def.thresholds
    .filter((t) => t.kind === 'auxiliary-spillway' || t.kind === 'crest-less-freeboard')
    .map((t) => t.id);
  return {
    poolLevels,
    rateOfRise: a.rateOfRise ?? DEFAULT_RATE_OF_RISE,
    gaugeDisagreement: a.gaugeDisagreement ?? DEFAULT_GAUGE_DISAGREEMENT,
    frozen,
    outOfRange: a.outOfRange ?? DEFAULT_OUT_OF_RANGE,
    massBalance: a.massBalance ?? DEFAULT_MASS_BALANCE,
    forecast: a.forecast ?? { thresholds: defaultForecastLevels, ...DEFAULT_FORECAST },
    seepage: a.seepage ?? DEFAULT_SEEPAGE,
    piezometers: a.piezometers ?? DEFAULT_PIEZOMETERS,
    shelveMaxS: a.shelveMaxS ?? DEFAULT_SHELVE_MAX_S,
  };
}
