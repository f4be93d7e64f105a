import { createStorageCurve } from '@stillwell/shared/hydraulics';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { describe, expect, it } from 'vitest';
import { parseCli } from '../cli-options.js';
import { ReservoirPlant } from '../plant/reservoir-plant.js';
import { DEMO_STORM } from './demo-storm.js';
import { leakFlow, parseLeak } from './leak.js';

describe('the hidden-leak option', () => {
  it('reads side:hour[:peak] and refuses anything else', () => {
    expect(parseLeak('left:20')).toEqual({
      abutment: 'left',
      startHour: 20,
      peakFlow: 8,
      growthHours: 3,
      weirShare: 0.005,
    });
    expect(parseLeak('right:30.5:4')).toMatchObject({
      abutment: 'right',
      startHour: 30.5,
      peakFlow: 4,
    });
    for (const bad of ['middle:20', 'left', 'left:-1', 'left:20:0', 'left:x'])
      expect(() => parseLeak(bad)).toThrow(RangeError);
  });

  it('is a command-line option of the simulator', () => {
    const r = parseCli(['--leak', 'left:20'], {});
    expect(r.help).toBe(false);
    if (!r.help) expect(r.options.leak).toMatchObject({ abutment: 'left', startHour: 20 });
  });

  it('grows from nothing at its start hour towards its peak', () => {
    const leak = parseLeak('left:20');
    expect(leakFlow(leak, 20, 22, 22)).toBe(0);
    expect(leakFlow(leak, 23, 22, 22)).toBeCloseTo(8 * (1 - Math.exp(-1)), 9);
    expect(leakFlow(leak, 200, 22, 22)).toBeCloseTo(8, 6);
  });
});

describe('the plant with a leak', () => {
  const run = (leak?: string) => {
    const plant = new ReservoirPlant({
      reservoir: DEMO_RESERVOIR,
      scenario: { ...DEMO_STORM, leak: leak ? parseLeak(leak) : undefined },
      startMs: Date.UTC(2030, 0, 1),
    });
    let leaked = 0;
    for (let i = 0; i < 24 * 360; i++) leaked += plant.step(10).instruments.leak * 10;
    return { plant, leaked };
  };

  it('takes the leaked water out of storage, unmeasured, and raises the seepage at that abutment only', () => {
    const healthy = run();
    const leaking = run('left:20');
    const curve = createStorageCurve(DEMO_RESERVOIR.storageTable);
    const lost =
      curve.storageAt(healthy.plant.state.pool) - curve.storageAt(leaking.plant.state.pool);
    // the outflow changes a little with the lower pool, hence 2 %
    expect(lost / leaking.leaked).toBeGreaterThan(0.98);
    expect(lost / leaking.leaked).toBeLessThan(1.02);
    expect(leaking.plant.state.outflow).toBeLessThanOrEqual(healthy.plant.state.outflow);
    const [h, l] = [healthy.plant.state.instruments, leaking.plant.state.instruments];
    expect(l.seepage['weir-left']! - h.seepage['weir-left']!).toBeCloseTo(l.leak * 0.005, 4);
    expect(l.seepage['weir-right']).toBeCloseTo(h.seepage['weir-right']!, 4);
  });
});
