import type { Leak } from './leak.js';

export type { Leak };

/**
 * Scenario definitions are plain data so that new storms and fault drills can be written without
 * touching the model. Hours are counted from the plant's start time.
 */

/** One gamma-shaped (Pearson type III) rise and recession above the base value. */
export interface Pulse {
  /** the pulse leaves zero here, h */
  startHour: number;
  /** the pulse reaches `peak` here, h */
  peakHour: number;
  /** height of the pulse above the base at its peak (m3/s for inflow, mm/h for rain) */
  peak: number;
  /** larger is sharper; 1 gives a sudden rise, 3-6 a typical flood hydrograph */
  shape: number;
}

export const FAULT_KINDS = ['dropout', 'freeze'] as const;
export type FaultKind = (typeof FAULT_KINDS)[number];

/**
 * A device fault over [startHour, endHour). A drop-out loses the device's messages in transit (its
 * sequence numbers keep counting, so a gap shows); a freeze keeps it publishing its last value.
 */
export interface DeviceFault {
  kind: FaultKind;
  deviceId: string;
  startHour: number;
  endHour: number;
}

export interface InitialSettings {
  /** pool elevation at the start, m */
  pool: number;
  /** gate openings, m, by gate id; gates not named start closed */
  gates: Readonly<Record<string, number>>;
  /** valve openings, %, by structure id; valves not named start closed */
  valves: Readonly<Record<string, number>>;
}

export interface Scenario {
  id: string;
  name: string;
  description: string;
  /** after this the storm is over: inflow returns to the base and rain stops, h */
  durationHours: number;
  /** dry-weather inflow, m3/s */
  baseInflow: number;
  inflowPulses: readonly Pulse[];
  /** rain intensity at the rain gauge, mm/h (base zero) */
  rainPulses: readonly Pulse[];
  initial: InitialSettings;
  faults: readonly DeviceFault[];
  /** a hidden abutment leak (dam-safety drill), none by default */
  leak?: Leak;
}
