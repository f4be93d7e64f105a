import type { Structure } from './schema.js';
import type { OutletSettings } from './discharge.js';
import type { FlowSeries } from './inflow-series.js';
import type { GateSchedule } from './schedule.js';
import type { StorageCurve } from './storage-curve.js';

/**
 * Limits on how fast gate and valve moves may change the release, m3/s per second (both positive).
 * A move is slowed so that, at the pool level at the start of the step, it changes the outflow by
 * at most increase x dt (or decrease x dt). Changes caused by the pool itself rising or falling are
 * not limited: they are not the operator's to make.
 */
export interface ReleaseLimit {
  increase: number;
  decrease: number;
}

export interface RoutingOptions {
  storage: StorageCurve;
  structures: readonly Structure[];
  inflow: FlowSeries;
  /** pool elevation at `start`, m */
  initialElevation: number;
  /** openings at `start` (missing gates and valves closed) */
  initialSettings?: OutletSettings;
  schedule?: GateSchedule;
  /** start time, s (default: the first inflow time) */
  start?: number;
  /** length of the run, s */
  duration: number;
  /** time step, s (storage indication); output interval for the Runge-Kutta cross-check */
  dt: number;
  /** constant tailwater elevation, m (none: free outfall) */
  tailwater?: number;
  releaseLimit?: ReleaseLimit;
  /**
   * When the pool would rise above the top of the storage table: 'throw' a RangeError (default),
   * or 'stop' the run there and report `leftTableAt`.
   */
  aboveTable?: 'throw' | 'stop';
}

/** Storage change against the integral of inflow minus outflow, m3. */
export interface MassBalance {
  /** exact integral of the inflow series over the run */
  inflowVolume: number;
  /** the method's own integral of the outflow */
  outflowVolume: number;
  storageChange: number;
  /** storageChange - (inflowVolume - outflowVolume) */
  error: number;
  /** error / the largest of the three volumes (0 when all are 0) */
  relativeError: number;
  /**
   * The solver's own closure: storageChange against the method's integral of the inflow as it
   * used it (storage indication: trapezoid of the inflow sampled at the steps). error minus this
   * is the inflow sampling error.
   */
  solverError: number;
}

export interface RoutingResult {
  method: 'storage-indication' | 'dormand-prince';
  /** s, at every output step */
  time: Float64Array;
  inflow: Float64Array;
  elevation: Float64Array;
  storage: Float64Array;
  outflow: Float64Array;
  /** gate openings (m) and valve openings (%) by id */
  openings: Record<string, Float64Array>;
  peakElevation: number;
  peakElevationTime: number;
  peakOutflow: number;
  peakOutflowTime: number;
  massBalance: MassBalance;
  /** true when a release limit slowed at least one move */
  throttled: boolean;
  /** time the pool reached the top of the storage table (run stopped there), or null */
  leftTableAt: number | null;
}

export function massBalance(
  inflowVolume: number,
  outflowVolume: number,
  storageChange: number,
  methodInflowVolume = inflowVolume,
): MassBalance {
  const error = storageChange - (inflowVolume - outflowVolume);
  const scale = Math.max(Math.abs(inflowVolume), Math.abs(outflowVolume), Math.abs(storageChange));
  return {
    inflowVolume,
    outflowVolume,
    storageChange,
    error,
    relativeError: scale > 0 ? error / scale : 0,
    solverError: storageChange - (methodInflowVolume - outflowVolume),
  };
}

/** Trapezoidal integral of samples y at uniform spacing dt over the first n + 1 samples. */
export function trapezoid(y: ArrayLike<number>, dt: number, n = y.length - 1): number {
  let s = 0;
  for (let i = 1; i <= n; i++) s += y[i - 1]! + y[i]!;
  return 0.5 * dt * s;
}
