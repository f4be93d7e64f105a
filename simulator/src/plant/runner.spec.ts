import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { describe, expect, it } from 'vitest';
import { DEMO_STORM } from '../scenarios/demo-storm.js';
import { PlantClock } from './clock.js';
import { ReservoirPlant } from './reservoir-plant.js';
import { PlantRunner } from './runner.js';

const START = Date.UTC(2030, 0, 1);

function setup(opts: { budgetMs?: number; canStep?: () => boolean } = {}) {
  let wall = 1_000_000;
  const plant = new ReservoirPlant({
    reservoir: DEMO_RESERVOIR,
    scenario: DEMO_STORM,
    startMs: START,
  });
  const clock = new PlantClock(START, 360, wall);
  const stepped: number[] = [];
  const slips: number[] = [];
  const runner = new PlantRunner({
    plant,
    clock,
    stepS: 10,
    onStep: (s) => stepped.push(s.timeMs),
    onSlip: (s) => slips.push(s),
    now: () => wall,
    ...opts,
  });
  return { plant, clock, runner, stepped, slips, advanceWall: (ms: number) => (wall += ms) };
}

describe('PlantRunner', () => {
  it('steps in whole plant-time steps up to the clock', () => {
    const { runner, stepped, advanceWall } = setup();
    advanceWall(1000); // 360 plant seconds
    runner.tick();
    expect(stepped).toHaveLength(36);
    expect(stepped.at(-1)).toBe(START + 360_000);
    advanceWall(15); // 5.4 plant seconds: less than a step
    runner.tick();
    expect(stepped).toHaveLength(36);
  });

  it('re-anchors the clock instead of piling up a backlog it cannot work off', () => {
    const { runner, stepped, slips, clock, plant, advanceWall } = setup({ budgetMs: 0 });
    advanceWall(10_000); // 3600 plant seconds due; a zero budget allows one step per tick
    runner.tick();
    expect(stepped).toHaveLength(1);
    expect(slips).toHaveLength(1);
    expect(slips[0]).toBeCloseTo(3590, 6);
    expect(clock.nominalAt(1_010_000)).toBe(plant.state.timeMs);
  });

  it('waits while the devices are congested', () => {
    let open = false;
    const { runner, stepped, advanceWall } = setup({ canStep: () => open });
    advanceWall(1000);
    runner.tick();
    expect(stepped).toHaveLength(0);
    open = true;
    runner.tick();
    expect(stepped).toHaveLength(36);
  });
});
