import type { LowLevelOutlet, RatingTable, StorageRow } from '../schema.js';

/** Storage table of a vertical-walled (prismatic) basin of plan area A from bottom to top. */
export function prismaticTable(area: number, bottom: number, top: number): StorageRow[] {
  return [
    { elevation: bottom, area, storage: 0 },
    { elevation: top, area, storage: area * (top - bottom) },
  ];
}

/** Rating Q = A (h - bottom) / K of a linear reservoir S = K Q in a prismatic basin. */
export function linearRating(area: number, k: number, bottom: number, top: number): RatingTable {
  return {
    id: 'linear',
    name: 'Linear reservoir outlet',
    kind: 'rating-table',
    interpolation: 'linear',
    rows: [
      { elevation: bottom, discharge: 0 },
      { elevation: top, discharge: (area * (top - bottom)) / k },
    ],
  };
}

/**
 * A sharp-edged orifice of area a and discharge coefficient Cd at elevation z, as a low-level
 * outlet whose losses add up to 1 / Cd^2 - 1 velocity heads (valve id = 'orifice').
 */
export function orificeOutlet(a: number, cd: number, z: number): LowLevelOutlet {
  const diameter = Math.sqrt((4 * a) / Math.PI);
  const frictionFactor = 1e-9;
  const length = 1e-6;
  return {
    id: 'orifice',
    name: 'Orifice',
    kind: 'low-level-outlet',
    valveChannel: 'orifice.valve',
    diameter,
    length,
    outletElevation: z,
    frictionFactor,
    entranceLossCoefficient: 1 / (cd * cd) - 1 - (frictionFactor * length) / diameter,
    valveLossCoefficient: 0,
    travelSpeed: 1,
  };
}

/**
 * A synthetic storm hydrograph (gamma shape, as the SCS dimensionless unit hydrograph is often
 * approximated): q(t) = base + (peak - base) (t/tp)^m e^(m (1 - t/tp)), sampled every dt to the end.
 */
export function gammaStorm(o: {
  base: number;
  peak: number;
  peakTime: number;
  shape: number;
  duration: number;
  dt: number;
}): { t: Float64Array; q: Float64Array } {
  const n = Math.round(o.duration / o.dt);
  const t = new Float64Array(n + 1);
  const q = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    const x = (i * o.dt) / o.peakTime;
    t[i] = i * o.dt;
    q[i] = o.base + (o.peak - o.base) * Math.pow(x, o.shape) * Math.exp(o.shape * (1 - x));
  }
  return { t, q };
}
