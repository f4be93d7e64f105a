import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import { DEMO_RESERVOIR } from '../reservoirs/demo.js';
import { STANDARD_GRAVITY } from '../units/units.js';
import { totalOutflow } from './discharge.js';
import { seriesAt } from './inflow-series.js';
import { routeStorageIndication } from './route.js';
import { routeDormandPrince } from './route-rk.js';
import { createStorageCurve } from './storage-curve.js';
import { gammaStorm, linearRating, orificeOutlet, prismaticTable } from './testing/fixtures.js';

// mathjs 15 ships solveODE without a type declaration
type SolveOde = (
  f: (t: number, y: number[]) => number[],
  tspan: [number, number],
  y0: number[],
  options: { method: 'RK45'; tol: number; maxStep: number; maxIter: number },
) => { t: number[]; y: number[][] };
const solveODE = (math as unknown as { solveODE: SolveOde }).solveODE;

const HOUR = 3600;
const storage = createStorageCurve(DEMO_RESERVOIR.storageTable);
// A storm shaped as planned for the demo (peak about 1,900 m3/s near hour 30 of 72).
const inflow = gammaStorm({
  base: 50,
  peak: 1900,
  peakTime: 30 * HOUR,
  shape: 3.7,
  duration: 72 * HOUR,
  dt: 600,
});
const gates = ['gate-1', 'gate-2', 'gate-3'];
const schedule = gates.map((id) => ({ time: 12 * HOUR, id, target: 4 }));
const demoRun = {
  storage,
  structures: DEMO_RESERVOIR.structures,
  inflow,
  initialElevation: 204.5,
  duration: 72 * HOUR,
  dt: 60,
  schedule,
};

describe('Dormand-Prince cross-check: analytic cases', () => {
  it('linear reservoir step response matches Q(t) = I (1 - e^(-t/K)) (analytic)', () => {
    const A = 1e6;
    const K = 7200;
    const res = routeDormandPrince({
      storage: createStorageCurve(prismaticTable(A, 0, 100)),
      structures: [linearRating(A, K, 0, 100)],
      inflow: { t: [0, 1e6], q: [500, 500] },
      initialElevation: 0,
      duration: 10 * HOUR,
      dt: 600,
    });
    res.outflow.forEach((q, i) =>
      expect(Math.abs(q - 500 * (1 - Math.exp(-res.time[i]! / K)))).toBeLessThan(1e-5),
    );
  });
  it('orifice drain time matches t = 2A (sqrt(h1) - sqrt(h2)) / (Cd a sqrt(2g)) to 0.01 s', () => {
    const res = routeDormandPrince({
      storage: createStorageCurve(prismaticTable(2, 0, 4)),
      structures: [orificeOutlet(0.005, 0.62, 0)],
      initialSettings: { gates: {}, valves: { orifice: 100 } },
      inflow: { t: [0], q: [0] },
      initialElevation: 3,
      duration: 400,
      dt: 0.01,
    });
    const analytic =
      (2 * 2 * (Math.sqrt(3) - Math.sqrt(0.5))) / (0.62 * 0.005 * Math.sqrt(2 * STANDARD_GRAVITY));
    const i = res.elevation.findIndex((h) => h <= 0.5);
    expect(Math.abs(res.time[i]! - analytic)).toBeLessThan(0.01);
  });
});

describe('demo reservoir through a storm: storage indication against Dormand-Prince', () => {
  const si = routeStorageIndication(demoRun);
  const rk = routeDormandPrince(demoRun);
  it('agree within 5 mm in level and 1 m3/s in outflow at dt = 60 s', () => {
    let dh = 0;
    let dq = 0;
    for (let i = 0; i < si.time.length; i++) {
      dh = Math.max(dh, Math.abs(si.elevation[i]! - rk.elevation[i]!));
      dq = Math.max(dq, Math.abs(si.outflow[i]! - rk.outflow[i]!));
    }
    expect(dh).toBeLessThan(0.005);
    expect(dq).toBeLessThan(1);
    expect(Math.abs(si.peakElevation - rk.peakElevation)).toBeLessThan(0.002);
    expect(Math.abs(si.peakElevationTime - rk.peakElevationTime)).toBeLessThanOrEqual(10 * 60);
  });
  it('both close their mass balance', () => {
    expect(Math.abs(si.massBalance.relativeError)).toBeLessThan(1e-6);
    expect(Math.abs(rk.massBalance.relativeError)).toBeLessThan(1e-9);
  });
  it('the gates follow the schedule at 0.005 m/s: 4 m reached 800 s after 12 h (output every 60 s)', () => {
    const at = (t: number) => si.openings['gate-2']![Math.round(t / 60)]!;
    expect(at(12 * HOUR)).toBe(0);
    expect(at(12 * HOUR + 420)).toBeCloseTo(2.1, 12);
    expect(at(12 * HOUR + 780)).toBeCloseTo(3.9, 12);
    expect(at(12 * HOUR + 840)).toBe(4);
    expect(at(20 * HOUR)).toBe(4);
    expect(rk.openings['gate-2']![Math.round((12 * HOUR + 420) / 60)]).toBeCloseTo(2.1, 12);
  });
});

describe('demo reservoir: independent ODE solution with mathjs solveODE (Dormand-Prince RK45)', () => {
  it('agrees with the storage-indication routing within 1 cm of level over the storm', () => {
    // Independent right-hand side: the public discharge functions, its own gate ramp, storage in Mm3.
    const opening = (t: number) => Math.min(4, Math.max(0, (t - 12 * HOUR) * 0.005));
    const f = (t: number, y: number[]) => {
      const h = storage.elevationAt(Math.min(Math.max(y[0]! * 1e6, 0), storage.maxStorage));
      const o = opening(t);
      const q = totalOutflow(DEMO_RESERVOIR.structures, h, {
        gates: { 'gate-1': o, 'gate-2': o, 'gate-3': o },
        valves: {},
      });
      return [(seriesAt(inflow, t) - q) / 1e6];
    };
    const sol = solveODE(f, [0, 72 * HOUR], [storage.storageAt(204.5) / 1e6], {
      method: 'RK45',
      tol: 1e-8,
      maxStep: 600,
      maxIter: 1e6,
    });
    const si = routeStorageIndication(demoRun);
    let worst = 0;
    let peak = -Infinity;
    sol.t.forEach((t, i) => {
      const h = storage.elevationAt(sol.y[i]![0]! * 1e6);
      peak = Math.max(peak, h);
      // storage-indication level at t, linear between its steps
      const k = Math.min(Math.floor(t / 60), si.time.length - 2);
      const w = t / 60 - k;
      const hsi = si.elevation[k]! * (1 - w) + si.elevation[k + 1]! * w;
      worst = Math.max(worst, Math.abs(h - hsi));
    });
    expect(sol.t.length).toBeGreaterThan(100);
    expect(worst).toBeLessThan(0.01);
    expect(Math.abs(peak - si.peakElevation)).toBeLessThan(0.005);
  });
});
