import { createStorageCurve } from '@stillwell/shared/hydraulics';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { describe, expect, it } from 'vitest';
import { DEMO_STORM } from '../scenarios/demo-storm.js';
import type { Scenario } from '../scenarios/scenario.js';
import { ReservoirPlant, type Settings } from './reservoir-plant.js';

const STEP_S = 10;
const STEPS_PER_HOUR = 3600 / STEP_S;
const ALL_GATES = (opening: number) => ({
  'gate-1': opening,
  'gate-2': opening,
  'gate-3': opening,
});

function newPlant(scenario: Scenario = DEMO_STORM) {
  return new ReservoirPlant({ reservoir: DEMO_RESERVOIR, scenario, startMs: Date.UTC(2030, 0, 1) });
}

/** Runs the storm, applying `orders` at their hours; returns the peak pool. */
function peakPool(orders: Array<{ hour: number; change: Partial<Settings> }>, hours = 72) {
  const plant = newPlant();
  let peak = plant.state.pool;
  for (let i = 0; i < hours * STEPS_PER_HOUR; i++) {
    for (const o of orders) if (o.hour * STEPS_PER_HOUR === i) plant.setTargets(o.change);
    peak = Math.max(peak, plant.step(STEP_S).pool);
  }
  return peak;
}

describe('ReservoirPlant', () => {
  it('conserves mass over the storm: storage change equals integrated inflow minus outflow', () => {
    // Independent of the integrator: storage from the shared curve at the reported pools, flows
    // integrated by the trapezoidal rule from the reported states, with gates moving mid-storm.
    const curve = createStorageCurve(DEMO_RESERVOIR.storageTable);
    const plant = newPlant();
    const start = plant.state;
    let prev = start;
    let inVolume = 0;
    let netVolume = 0;
    for (let i = 0; i < 72 * STEPS_PER_HOUR; i++) {
      if (i === 12 * STEPS_PER_HOUR)
        plant.setTargets({ gates: ALL_GATES(6), valves: { 'low-level-outlet': 60 } });
      if (i === 40 * STEPS_PER_HOUR) plant.setTargets({ gates: ALL_GATES(1.5) });
      const next = plant.step(STEP_S);
      inVolume += ((prev.inflow + next.inflow) / 2) * STEP_S;
      netVolume += ((prev.inflow - prev.outflow + next.inflow - next.outflow) / 2) * STEP_S;
      prev = next;
    }
    const storageChange = curve.storageAt(prev.pool) - curve.storageAt(start.pool);
    // Stated tolerance: 0.01 % of the storm's inflow volume (about 4 600 m3 of some 4.6e7 m3);
    // one lost 10 s step at the peak would be 19 000 m3.
    expect(inVolume).toBeGreaterThan(4e7);
    expect(Math.abs(storageChange - netVolume)).toBeLessThan(1e-4 * inVolume);
  });

  it('moves gates toward their targets at the gate travel speed, without overshoot', () => {
    const plant = newPlant();
    const speed = DEMO_RESERVOIR.structures.flatMap((s) =>
      s.kind === 'gated-spillway' ? s.gates : [],
    )[0]!.travelSpeed;
    plant.setTargets({ gates: { 'gate-1': 9 } });
    for (let i = 0; i < 60; i++) plant.step(STEP_S);
    expect(plant.state.settings.gates['gate-1']).toBeCloseTo(speed * 600, 9);
    expect(plant.state.settings.gates['gate-2']).toBe(0);
    expect(plant.targetSettings.gates['gate-1']).toBe(9);
    for (let i = 0; i < 1000; i++) plant.step(STEP_S);
    expect(plant.state.settings.gates['gate-1']).toBe(9);
    plant.setTargets({ gates: { 'gate-1': 8 } });
    for (let i = 0; i < 6; i++) plant.step(STEP_S);
    expect(plant.state.settings.gates['gate-1']).toBeCloseTo(9 - speed * 60, 9);
  });

  it('moves the outlet valve at its own speed and clamps targets to the range', () => {
    const plant = newPlant();
    expect(plant.state.settings.valves['low-level-outlet']).toBe(10);
    plant.setTargets({ valves: { 'low-level-outlet': 150 } });
    expect(plant.targetSettings.valves['low-level-outlet']).toBe(100);
    plant.step(STEP_S);
    expect(plant.state.settings.valves['low-level-outlet']).toBeCloseTo(10 + 0.5 * STEP_S, 9);
  });

  it('overtops the dam with the gates kept closed, and stays below normal maximum if opened at hour 12', () => {
    const closed = peakPool([]);
    const opened = peakPool([{ hour: 12, change: { gates: ALL_GATES(9) } }]);
    const late = peakPool([{ hour: 27, change: { gates: ALL_GATES(9) } }]);
    expect(closed).toBeGreaterThan(DEMO_RESERVOIR.damCrestElevation);
    expect(opened).toBeLessThan(DEMO_RESERVOIR.normalMaxPool);
    expect(closed).toBeGreaterThan(opened);
    expect(late).toBeGreaterThan(opened);
  });

  it('reports the table top instead of failing when the pool goes beyond the storage table', () => {
    const deluge: Scenario = {
      ...DEMO_STORM,
      inflowPulses: [{ startHour: 0, peakHour: 6, peak: 20_000, shape: 2 }],
    };
    const plant = newPlant(deluge);
    for (let i = 0; i < 24 * STEPS_PER_HOUR; i++) plant.step(STEP_S);
    const top = DEMO_RESERVOIR.storageTable.at(-1)!;
    expect(plant.state.beyondTable).toBe(true);
    expect(plant.state.pool).toBeCloseTo(top.elevation, 6);
    expect(plant.state.storage).toBeGreaterThan(top.storage);
  });

  it('is deterministic', () => {
    const a = peakPool([{ hour: 20, change: { gates: ALL_GATES(5) } }], 36);
    const b = peakPool([{ hour: 20, change: { gates: ALL_GATES(5) } }], 36);
    expect(a).toBe(b);
  });
});
