import type { MassBalanceLimits } from './limits.js';
import type { TimeSeries } from './series.js';

export interface MassBalanceInputs {
  /** good readings of each pool gauge */
  pools: readonly TimeSeries[];
  inflow: TimeSeries;
  outflow: TimeSeries;
  /** storage, m3, at a pool elevation, m (the definition's curve) */
  storageAt: (elevation: number) => number;
  limits: MassBalanceLimits;
  /** site time, epoch ms: the window ends here */
  nowMs: number;
}

export interface MassBalanceResult {
  fromMs: number;
  toMs: number;
  /** storage change from the pool gauges, m3 (mean over the gauges that cover both ends) */
  measuredChange: number;
  /** the integral of measured inflow minus outflow over the same time, m3 */
  predictedChange: number;
  /** (measured - predicted) / duration, m3/s: negative means water leaving unmeasured */
  residualFlow: number;
  /** mean of inflow + outflow over the window, m3/s */
  meanThroughflow: number;
  /** the residual allowed for gauge error, m3/s */
  tolerance: number;
  gauges: number;
}

/** readings at each end of the window: fewer and gauge noise dominates */
const MIN_END_READINGS = 3;

/**
 * The reservoir's water balance over a sliding window: the storage change the pool gauges show
 * (through the elevation-area-storage curve) against what the measured inflow and outflow say it
 * should be. The pool at each end is a mean over `endAverageS`, per gauge, and the gauges'
 * changes are averaged: a gauge's fixed offset cancels in its own difference, and a gauge missing
 * at one end does not bias the result. Null when the record does not cover the window.
 */
export function massBalance(inputs: MassBalanceInputs): MassBalanceResult | null {
  const { limits, nowMs, storageAt } = inputs;
  const endMs = limits.endAverageS * 1000;
  const gapMs = limits.maxGapS * 1000;
  const endTo = nowMs;
  const startTo = nowMs - limits.windowS * 1000;
  let residualSum = 0;
  let measuredSum = 0;
  let predictedSum = 0;
  let throughSum = 0;
  let fromSum = 0;
  let toSum = 0;
  let gauges = 0;
  for (const pool of inputs.pools) {
    const a = pool.mean(startTo - endMs, startTo, MIN_END_READINGS);
    const b = pool.mean(endTo - endMs, endTo, MIN_END_READINGS);
    if (!a || !b || !(b.t > a.t)) continue;
    const inVol = inputs.inflow.integral(a.t, b.t, gapMs);
    const outVol = inputs.outflow.integral(a.t, b.t, gapMs);
    if (inVol === null || outVol === null) continue;
    const seconds = (b.t - a.t) / 1000;
    const measured = storageAt(b.v) - storageAt(a.v);
    const predicted = (inVol - outVol) / 1000;
    residualSum += (measured - predicted) / seconds;
    measuredSum += measured;
    predictedSum += predicted;
    throughSum += (inVol + outVol) / 1000 / seconds;
    fromSum += a.t;
    toSum += b.t;
    gauges++;
  }
  if (gauges === 0) return null;
  const meanThroughflow = throughSum / gauges;
  return {
    fromMs: fromSum / gauges,
    toMs: toSum / gauges,
    measuredChange: measuredSum / gauges,
    predictedChange: predictedSum / gauges,
    residualFlow: residualSum / gauges,
    meanThroughflow,
    tolerance: limits.toleranceFlow + limits.toleranceFraction * meanThroughflow,
    gauges,
  };
}
