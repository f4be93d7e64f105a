import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR } from '../reservoirs/demo.js';
import { compileOutflow } from './outflow-model.js';
import { routeStorageIndication } from './route.js';
import {
  advanceControl,
  compileSchedule,
  scheduleTrajectory,
  trajectoryAt,
  validateSchedule,
} from './schedule.js';
import { createStorageCurve } from './storage-curve.js';

const model = compileOutflow(DEMO_RESERVOIR.structures);
const g1 = model.indexOf('gate-1');
const valve = model.indexOf('low-level-outlet');

describe('gate schedule kinematics', () => {
  const plan = compileSchedule(model, [
    { time: 100, id: 'gate-1', target: 2 }, // 400 s of travel at 0.005 m/s
    { time: 300, id: 'gate-1', target: 0.5 }, // reversed after 200 s, at 1 m
    { time: 50, id: 'low-level-outlet', target: 100 },
  ]);
  it('lists the controls with their speeds', () => {
    expect(model.controls.map((c) => `${c.id}:${c.kind}:${c.speed}`)).toEqual([
      'gate-1:gate:0.005',
      'gate-2:gate:0.005',
      'gate-3:gate:0.005',
      'low-level-outlet:valve:0.5',
    ]);
  });
  it('moves at the travel speed, reverses exactly at a new target, and holds before the first entry', () => {
    expect(advanceControl(plan, g1, 0, 0, 100)).toBe(0);
    expect(advanceControl(plan, g1, 0, 0, 200)).toBeCloseTo(0.5, 12);
    expect(advanceControl(plan, g1, 0, 0, 300)).toBeCloseTo(1, 12);
    expect(advanceControl(plan, g1, 0, 0, 400)).toBeCloseTo(0.5, 12);
    expect(advanceControl(plan, g1, 0, 0, 1e4)).toBe(0.5);
    // stepping in pieces gives the same as one step (the kinematics do not depend on the time step)
    let x = 0;
    for (let t = 0; t < 400; t += 7) x = advanceControl(plan, g1, x, t, Math.min(400, t + 7));
    expect(x).toBeCloseTo(0.5, 12);
    expect(advanceControl(plan, valve, 0, 0, 150)).toBe(50);
  });
  it('gives the same exact trajectory, with its corners', () => {
    const traj = scheduleTrajectory(plan, new Float64Array(4), 0, 1000);
    expect(Array.from(traj.times[g1]!)).toEqual([0, 100, 300, 400, 1000]);
    const out = new Float64Array(4);
    expect(trajectoryAt(traj, 350, out)[g1]).toBeCloseTo(0.75, 12);
    expect(Array.from(traj.times[valve]!)).toEqual([0, 50, 250, 1000]);
  });
  it('rejects unknown ids and targets outside the range, naming the entry', () => {
    expect(validateSchedule(model, [{ time: 0, id: 'gate-9', target: 1 }])).toEqual([
      'schedule entry 1 (gate-9): no gate or valve with this id',
    ]);
    expect(validateSchedule(model, [{ time: 0, id: 'gate-2', target: 9.5 }])).toEqual([
      'schedule entry 1 (gate-2): target 9.5 m is outside 0..9 m',
    ]);
    expect(() =>
      compileSchedule(model, [{ time: 0, id: 'low-level-outlet', target: 120 }]),
    ).toThrow('outside 0..100 %');
  });
});

describe('leaving the storage table', () => {
  const o = {
    storage: createStorageCurve(DEMO_RESERVOIR.storageTable),
    structures: DEMO_RESERVOIR.structures,
    inflow: { t: [0], q: [5000] },
    initialElevation: 210,
    duration: 12 * 3600,
    dt: 60,
  };
  it('throws a RangeError saying when, by default', () => {
    const top = o.storage.maxElevation;
    expect(() => routeStorageIndication(o)).toThrow(
      `rises above the top of the storage table (${top} m) between`,
    );
  });
  it("stops and reports the time with aboveTable: 'stop'", () => {
    const r = routeStorageIndication({ ...o, aboveTable: 'stop' });
    expect(r.leftTableAt).not.toBeNull();
    expect(r.time[r.time.length - 1]).toBe(r.leftTableAt! - 60);
    expect(r.peakElevation).toBe(o.storage.maxElevation);
  });
});
