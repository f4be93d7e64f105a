import type { Verdict } from './detector.js';
import type { EngineState, Judgement } from './engine-state.js';
import { massBalance, type MassBalanceResult } from './mass-balance.js';

/** A forecast older than this (site time) no longer speaks for the present: its alarms hold. */
export const FORECAST_MAX_AGE_MS = 2 * 3_600_000;
/** a forecast peak within this of a level neither raises nor clears its crossing alarm, m */
export const FORECAST_PEAK_DEADBAND = 0.05;

const hours = (s: number) => `${(s / 3600).toFixed(1)} h`;

/**
 * The forecast crossing a threshold within the horizon, and "time left to act" under the margin.
 * A crossing clears when the forecast peak falls below the level by a deadband, so a peak that
 * hovers at the level from one run to the next does not chatter. A level the pool is already
 * above has its pool alarm: the forecast one is then redundant and clears.
 */
export function evaluateForecast(s: EngineState, nowMs: number): Judgement[] {
  const f = s.forecast;
  const limits = s.settings.forecast;
  const current = f !== null && nowMs - f.computedAtMs <= FORECAST_MAX_AGE_MS;
  const out: Judgement[] = limits.thresholds.map((id) => {
    const t = current ? f.thresholds.find((x) => x.id === id) : undefined;
    const judgement: Judgement = {
      id: `forecast-crossing.${id}`,
      verdict: 'unknown',
      value: null,
      limit: t?.elevation ?? null,
      message: current ? `the forecast does not report ${id}` : 'no current forecast',
    };
    if (!t || !f) return judgement;
    const leadS = t.timeMs === null ? null : (t.timeMs - f.computedAtMs) / 1000;
    judgement.value = leadS;
    if (t.alreadyAbove) {
      judgement.verdict = 'reset';
      judgement.message = `the pool is above ${id} already`;
    } else if (leadS !== null && leadS <= limits.horizonS) {
      judgement.verdict = 'set';
      judgement.message = `forecast reaches ${t.elevation.toFixed(2)} m in ${hours(leadS)} (peak ${f.peak.elevation.toFixed(2)} m)`;
    } else {
      const clear = f.peak.elevation < t.elevation - FORECAST_PEAK_DEADBAND;
      judgement.verdict = clear ? 'reset' : 'deadband';
      judgement.message =
        leadS === null
          ? `forecast peak ${f.peak.elevation.toFixed(2)} m, below ${t.elevation.toFixed(2)} m`
          : `forecast reaches ${t.elevation.toFixed(2)} m in ${hours(leadS)}, beyond the horizon`;
    }
    return judgement;
  });
  let verdict: Verdict = 'unknown';
  let message = 'no current forecast';
  const tl = current ? f.timeLeft : null;
  if (tl) {
    if (tl.status === 'past' || tl.status === 'impossible') {
      verdict = 'set';
      message =
        tl.status === 'past'
          ? 'the standard plan is too late: it had to start earlier'
          : 'even started now the standard plan does not keep the peak down';
    } else if (tl.status === 'not-needed' || tl.timeLeftS === null) {
      verdict = 'reset';
      message = 'no gate action needed by the forecast';
    } else {
      const margin = limits.timeLeftMarginS;
      verdict =
        tl.timeLeftS < margin
          ? 'set'
          : tl.timeLeftS > margin + limits.timeLeftDeadbandS
            ? 'reset'
            : 'deadband';
      message = `time left to act ${hours(tl.timeLeftS)}; margin ${hours(margin)}`;
    }
  }
  out.push({
    id: 'time-left',
    verdict,
    value: tl?.timeLeftS ?? null,
    limit: limits.timeLeftMarginS,
    message,
  });
  return out;
}

/**
 * The water balance, evaluated every `everyS` of site time (the window moves slowly; the result
 * is held in between). Persistent residuals raise through the on-delay.
 */
export class MassBalanceEvaluator {
  private lastAt = -Infinity;
  private held: Judgement | null = null;
  latest: MassBalanceResult | null = null;

  evaluate(s: EngineState, nowMs: number): Judgement[] {
    const pools = s.def.poolChannels.map((id) => s.good.get(id)!);
    const inflow = s.def.channels.find((c) => c.role === 'inflow');
    const outflow = s.def.channels.find((c) => c.role === 'outflow');
    if (!inflow || !outflow) return [];
    const limits = s.settings.massBalance;
    if (this.held && nowMs - this.lastAt < limits.everyS * 1000) return [this.held];
    this.lastAt = nowMs;
    const r = massBalance({
      pools,
      inflow: s.good.get(inflow.id)!,
      outflow: s.good.get(outflow.id)!,
      storageAt: (z) => s.curve.storageAt(z),
      limits,
      nowMs,
    });
    this.latest = r;
    let verdict: Verdict = 'unknown';
    if (r) {
      const size = Math.abs(r.residualFlow);
      verdict =
        size > r.tolerance
          ? 'set'
          : size < r.tolerance * limits.clearFraction
            ? 'reset'
            : 'deadband';
    }
    this.held = {
      id: 'mass-balance',
      verdict,
      value: r?.residualFlow ?? null,
      limit: r?.tolerance ?? null,
      message: r
        ? `over ${hours((r.toMs - r.fromMs) / 1000)}: storage ${signed(r.measuredChange)} m3, inflow - outflow ${signed(r.predictedChange)} m3; ${signed(r.residualFlow, 2)} m3/s ${r.residualFlow < 0 ? 'missing' : 'extra'}, tolerance ${r.tolerance.toFixed(2)} m3/s`
        : 'the record does not cover the window (gaps or too few readings)',
    };
    return [this.held];
  }
}

const signed = (v: number, digits = 0) =>
  `${v >= 0 ? '+' : ''}${v.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits })}`;
