import { vNotchFlow } from '../hydraulics/v-notch.js';
import type { SeepageWeir } from '../reservoirs/definition.js';
import { limitVerdict } from './detector.js';
import type { EngineState, Judgement } from './engine-state.js';

const ls = (q: number) => `${(q * 1000).toFixed(1)} l/s`;

/** Seepage flow over the weir from its head: the V-notch equation with the weir's coefficients. */
export function weirFlow(w: SeepageWeir, head: number): number {
  return vNotchFlow(head, {
    angleDeg: w.notchAngleDeg,
    dischargeCoefficient: w.dischargeCoefficient,
    headCorrection: w.headCorrection,
  });
}

/** The baseline's steady-state flow at a pool elevation, m3/s. */
export function baselineFlow(w: SeepageWeir, pool: number): number {
  const b = w.baseline;
  const x = (pool - b.zeroFlowPool) / (b.referencePool - b.zeroFlowPool);
  return x > 0 ? b.referenceFlow * x ** b.exponent : 0;
}

/** The flow above which the weir is "rising against its baseline" at a (lagged) pool. */
export function baselineLimit(w: SeepageWeir, laggedPool: number): number {
  return baselineFlow(w, laggedPool) * (1 + w.baseline.tolerance) + w.baseline.toleranceFlow;
}

/**
 * Each seepage weir: its flow above the definition's maximum, and its flow above what the
 * baseline gives for the pool. The baseline is taken at the pool lagged as seepage lags it, so the
 * weir's slow answer to a fast-rising or falling pool is not mistaken for a change of behaviour.
 */
export function evaluateSeepage(s: EngineState, nowMs: number): Judgement[] {
  const out: Judgement[] = [];
  const deadbandFraction = s.settings.seepage.deadbandFraction;
  for (const w of s.def.seepageWeirs ?? []) {
    const head = s.fresh(w.channel, nowMs) ? s.last.get(w.channel)!.v : null;
    const flow = head === null ? null : weirFlow(w, head);
    out.push({
      id: `seepage-high.${w.id}`,
      verdict: limitVerdict(flow, w.maxFlow, w.maxFlow * deadbandFraction),
      value: flow,
      limit: w.maxFlow,
      message:
        flow === null
          ? `${w.channel}: no good, fresh reading`
          : `${w.label}: ${ls(flow)} (head ${(head! * 1000).toFixed(1)} mm); limit ${ls(w.maxFlow)}`,
    });
    const lag = s.lags.get(w.id)!;
    const warm = lag.warm(nowMs);
    const limit = warm ? baselineLimit(w, lag.value!) : null;
    out.push({
      id: `seepage-baseline.${w.id}`,
      verdict: limit === null ? 'unknown' : limitVerdict(flow, limit, w.baseline.toleranceFlow / 2),
      value: flow,
      limit,
      message:
        flow === null || limit === null
          ? warm
            ? `${w.channel}: no good, fresh reading`
            : `${w.label}: the baseline needs ${2 * w.baseline.lagHours} h of pool record first`
          : `${w.label}: ${ls(flow)} against ${ls(baselineFlow(w, lag.value!))} expected at ${lag.value!.toFixed(2)} m (lagged ${w.baseline.lagHours} h); limit ${ls(limit)}`,
    });
  }
  return out;
}

/** Each foundation piezometer above its level. */
export function evaluatePiezometers(s: EngineState, nowMs: number): Judgement[] {
  const deadband = s.settings.piezometers.deadband;
  return (s.def.piezometers ?? []).map((p) => {
    const level = s.fresh(p.channel, nowMs) ? s.last.get(p.channel)!.v : null;
    return {
      id: `piezometer-high.${p.id}`,
      verdict: limitVerdict(level, p.maxLevel, deadband),
      value: level,
      limit: p.maxLevel,
      message:
        level === null
          ? `${p.channel}: no good, fresh reading`
          : `${p.label} at ${level.toFixed(2)} m; limit ${p.maxLevel.toFixed(2)} m`,
    };
  });
}
