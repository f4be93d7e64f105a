import { slopePerHour } from '../telemetry/series.js';
import { limitVerdict } from './detector.js';
import type { EngineState, Judgement } from './engine-state.js';

const m = (v: number) => `${v.toFixed(2)} m`;

/** The pool above each threshold of the definition. */
export function evaluatePoolLevels(s: EngineState, nowMs: number): Judgement[] {
  const pool = s.pool(nowMs);
  return s.settings.poolLevels.flatMap((p) => {
    const t = s.def.thresholds.find((x) => x.id === p.thresholdId);
    if (!t) return [];
    return [
      {
        id: `pool-high.${t.id}`,
        verdict: limitVerdict(pool?.value ?? null, t.elevation, p.deadband),
        value: pool?.value ?? null,
        limit: t.elevation,
        message: pool
          ? `pool ${m(pool.value)} (${pool.channel}); ${t.label} ${m(t.elevation)}`
          : 'no good, fresh pool gauge',
      },
    ];
  });
}

/**
 * Rate of rise: the least-squares slope of the pool gauge in use over the window. During first
 * filling the stricter limit applies over its longer window (a slow, sustained rise is what the
 * first-filling rules limit; over minutes the slope is mostly gauge noise).
 */
export function evaluateRateOfRise(s: EngineState, nowMs: number): Judgement[] {
  const r = s.settings.rateOfRise;
  const filling = r.firstFilling.active;
  const limit = filling ? r.firstFilling.limit : r.limit;
  const deadband = filling ? Math.min(r.deadband, r.firstFilling.limit / 4) : r.deadband;
  const windowMs = (filling ? r.firstFilling.windowS : r.windowS) * 1000;
  const pool = s.pool(nowMs);
  let rate: number | null = null;
  if (pool) {
    const points = s.good.get(pool.channel)!.between(nowMs - windowMs, nowMs);
    // a slope over much less than the window is not the rate the limit speaks of
    const spans = points.length >= 3 && points[points.length - 1]!.t - points[0]!.t >= windowMs / 2;
    rate = spans ? slopePerHour(points) : null;
  }
  return [
    {
      id: 'rate-of-rise',
      verdict: limitVerdict(rate, limit, deadband),
      value: rate,
      limit,
      message:
        rate === null
          ? 'not enough pool readings for a rate'
          : `pool rising ${rate.toFixed(3)} m/h over ${windowMs / 60_000} min; limit ${limit} m/h${filling ? ' (first filling)' : ''}`,
    },
  ];
}

/** The first two pool gauges, each averaged over the window, further apart than the tolerance. */
export function evaluateGaugeDisagreement(s: EngineState, nowMs: number): Judgement[] {
  if (s.def.poolChannels.length < 2) return [];
  const g = s.settings.gaugeDisagreement;
  const [a, b] = s.def.poolChannels as [string, string];
  const from = nowMs - g.windowS * 1000;
  const ma = s.fresh(a, nowMs) ? s.good.get(a)!.mean(from, nowMs, 3) : null;
  const mb = s.fresh(b, nowMs) ? s.good.get(b)!.mean(from, nowMs, 3) : null;
  const diff = ma && mb ? Math.abs(ma.v - mb.v) : null;
  return [
    {
      id: 'gauge-disagreement',
      verdict: limitVerdict(diff, g.tolerance, g.deadband),
      value: diff,
      limit: g.tolerance,
      message:
        ma && mb
          ? `${a} ${m(ma.v)}, ${b} ${m(mb.v)} (means over ${g.windowS / 60} min): ${m(diff!)} apart`
          : 'both gauges are needed to compare them',
    },
  ];
}
