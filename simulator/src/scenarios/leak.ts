/**
 * A hidden leak through an abutment, for dam-safety drills: from `startHour` a concentrated leak
 * opens and grows towards `peakFlow` (m3/s) with time constant `growthHours`, scaled by the square
 * root of the head on it. The water leaves the reservoir by no measured path: no gauge sees it,
 * except for the small part that surfaces at that abutment's seepage weir.
 */
export interface Leak {
  abutment: 'left' | 'right';
  startHour: number;
  /** m3/s at the reference head, once fully grown */
  peakFlow: number;
  growthHours: number;
  /** the part of the leak that reaches the abutment's seepage weir */
  weirShare: number;
}

export const LEAK_DEFAULTS = { peakFlow: 8, growthHours: 3, weirShare: 0.005 } as const;

const LEAK_TEXT = /^(left|right):(\d+(?:\.\d+)?)(?::(\d+(?:\.\d+)?))?$/;

/** Reads "left:20" or "right:30:5" (abutment, start hour, peak flow m3/s) from the command line. */
export function parseLeak(text: string): Leak {
  const match = LEAK_TEXT.exec(text.trim());
  if (!match) {
    throw new RangeError(
      `--leak "${text}": expected left|right:startHour[:peakFlow], e.g. left:20 or right:30:5`,
    );
  }
  const [, abutment, start = '', peak] = match;
  const leak: Leak = {
    abutment: abutment as Leak['abutment'],
    startHour: Number(start),
    peakFlow: peak === undefined ? LEAK_DEFAULTS.peakFlow : Number(peak),
    growthHours: LEAK_DEFAULTS.growthHours,
    weirShare: LEAK_DEFAULTS.weirShare,
  };
  if (!(leak.peakFlow > 0 && leak.peakFlow <= 500))
    throw new RangeError(`--leak "${text}": the peak flow must be above 0 and at most 500 m3/s`);
  return leak;
}

/**
 * The leak's flow at an hour and a head over the leak's exit (m), relative to the head at which
 * peakFlow is reached (orifice-like: flow grows as the square root of the head).
 */
export function leakFlow(leak: Leak, hour: number, head: number, referenceHead: number): number {
  if (hour <= leak.startHour || !(head > 0)) return 0;
  const grown = 1 - Math.exp(-(hour - leak.startHour) / leak.growthHours);
  return leak.peakFlow * grown * Math.sqrt(head / referenceHead);
}
