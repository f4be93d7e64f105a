import type { ForecastSeries } from '@stillwell/shared/forecasts';

/**
 * When telemetry has moved far enough from what the last run assumed to be worth a run of its own
 * before the next scheduled one. The figures are the smallest changes an operator would expect
 * the forecast to answer: a gate moving 5 cm, a valve 2 %, the inflow 10 % (and 5 m3/s, so that
 * noise at low flows does not count), or the pool 5 cm away from where the last run put it now.
 */
export const MATERIAL_CHANGE = {
  gateM: 0.05,
  valvePct: 2,
  inflowFraction: 0.1,
  inflowMinM3s: 5,
  poolDepartureM: 0.05,
} as const;

export interface LastRunView {
  openings: Record<string, number>;
  inflowNow: number;
  series: Pick<ForecastSeries, 'startMs' | 'stepS' | 'elevation'>;
}

export interface CurrentView {
  /** readings by control id; a control without a usable reading is absent */
  openings: Record<string, { value: number; kind: 'gate' | 'valve' }>;
  inflow: number | null;
  pool: { elevation: number; tMs: number } | null;
}

/** The deterministic forecast elevation at a time, linear between the stored points. */
export function forecastElevationAt(s: LastRunView['series'], tMs: number): number | null {
  const x = (tMs - s.startMs) / (s.stepS * 1000);
  if (x < 0 || x > s.elevation.length - 1) return null;
  const i = Math.floor(x);
  const a = s.elevation[i]!;
  const b = s.elevation[Math.min(i + 1, s.elevation.length - 1)]!;
  return a + (b - a) * (x - i);
}

/** What changed materially since the last run, in words; null when nothing did. */
export function materialChange(last: LastRunView, now: CurrentView): string | null {
  for (const [id, { value, kind }] of Object.entries(now.openings)) {
    const before = last.openings[id] ?? 0;
    const limit = kind === 'gate' ? MATERIAL_CHANGE.gateM : MATERIAL_CHANGE.valvePct;
    if (Math.abs(value - before) > limit) {
      const unit = kind === 'gate' ? ' m' : ' %';
      return `${id} moved from ${before.toFixed(2)}${unit} to ${value.toFixed(2)}${unit}`;
    }
  }
  if (now.inflow !== null) {
    const change = Math.abs(now.inflow - last.inflowNow);
    if (
      change > MATERIAL_CHANGE.inflowMinM3s &&
      change > MATERIAL_CHANGE.inflowFraction * last.inflowNow
    ) {
      return `inflow ${now.inflow.toFixed(1)} m3/s against ${last.inflowNow.toFixed(1)} m3/s at the last run`;
    }
  }
  if (now.pool) {
    const expected = forecastElevationAt(last.series, now.pool.tMs);
    if (
      expected !== null &&
      Math.abs(now.pool.elevation - expected) > MATERIAL_CHANGE.poolDepartureM
    ) {
      return `pool ${now.pool.elevation.toFixed(3)} m departs from the forecast ${expected.toFixed(3)} m`;
    }
  }
  return null;
}
