/** A level of interest: alert levels, spillway crests, dam crest less freeboard, ... */
export interface LevelThreshold {
  id: string;
  elevation: number;
}

export interface ThresholdCrossing {
  id: string;
  elevation: number;
  /** first time the pool reaches the level (linear between steps), null if it does not */
  time: number | null;
  /** time - start of the run, s */
  leadTime: number | null;
  /** the pool is at or above the level at the start */
  alreadyAbove: boolean;
  /** total time at or above the level within the run, s */
  timeAbove: number;
}

export interface LevelSeries {
  time: ArrayLike<number>;
  elevation: ArrayLike<number>;
}

/** When the pool first reaches each threshold, and how long it stays at or above it. */
export function timeToThresholds(
  r: LevelSeries,
  thresholds: readonly LevelThreshold[],
): ThresholdCrossing[] {
  const n = r.time.length;
  const t0 = r.time[0]!;
  return thresholds.map(({ id, elevation }) => {
    const h0 = r.elevation[0]!;
    let time: number | null = h0 >= elevation ? t0 : null;
    let above = 0;
    for (let i = 1; i < n; i++) {
      const a = r.elevation[i - 1]!;
      const b = r.elevation[i]!;
      const ta = r.time[i - 1]!;
      const tb = r.time[i]!;
      if (time === null && a < elevation && b >= elevation)
        time = ta + ((elevation - a) / (b - a)) * (tb - ta);
      // time above within the step, with the level linear between the samples
      if (a >= elevation && b >= elevation) above += tb - ta;
      else if (a >= elevation || b >= elevation) {
        const w = (Math.max(a, b) - elevation) / Math.abs(b - a);
        above += w * (tb - ta);
      }
    }
    return {
      id,
      elevation,
      time,
      leadTime: time === null ? null : time - t0,
      alreadyAbove: h0 >= elevation,
      timeAbove: above,
    };
  });
}

export interface PeakSummary {
  elevation: number;
  time: number;
  outflow: number;
  outflowTime: number;
}

/** The forecast peak pool level and outflow (at step resolution). */
export function forecastPeak(r: {
  peakElevation: number;
  peakElevationTime: number;
  peakOutflow: number;
  peakOutflowTime: number;
}): PeakSummary {
  return {
    elevation: r.peakElevation,
    time: r.peakElevationTime,
    outflow: r.peakOutflow,
    outflowTime: r.peakOutflowTime,
  };
}
