import { describe, expect, it } from 'vitest';
import { DEMO_STORM } from './demo-storm.js';
import { activeFault, parseFault } from './faults.js';
import { inflowAt, pulseAt, rainAt } from './hydrograph.js';
import { findScenario } from './index.js';

function peakOf(f: (hour: number) => number) {
  let best = { hour: 0, value: -Infinity };
  for (let hour = 0; hour <= 72; hour += 0.05) {
    const value = f(hour);
    if (value > best.value) best = { hour, value };
  }
  return best;
}

describe('hydrograph', () => {
  it('a pulse is zero before its start and equals its peak at the peak hour', () => {
    const p = { startHour: 10, peakHour: 16, peak: 500, shape: 4 };
    expect(pulseAt(p, 10)).toBe(0);
    expect(pulseAt(p, 16)).toBeCloseTo(500, 9);
    expect(pulseAt(p, 15)).toBeLessThan(500);
    expect(pulseAt(p, 17)).toBeLessThan(500);
  });

  it('the demo storm peaks near 1,900 m3/s near hour 30, after the rain', () => {
    const inflow = peakOf((h) => inflowAt(DEMO_STORM, h));
    const rain = peakOf((h) => rainAt(DEMO_STORM, h));
    expect(inflow.value).toBeGreaterThan(1850);
    expect(inflow.value).toBeLessThan(1950);
    expect(Math.abs(inflow.hour - 30)).toBeLessThan(1);
    expect(inflow.hour - rain.hour).toBeGreaterThanOrEqual(2);
    expect(inflow.hour - rain.hour).toBeLessThanOrEqual(6);
  });

  it('starts at the base flow and returns to it when the storm is over', () => {
    expect(inflowAt(DEMO_STORM, 0)).toBe(DEMO_STORM.baseInflow);
    expect(inflowAt(DEMO_STORM, 80)).toBe(DEMO_STORM.baseInflow);
    expect(rainAt(DEMO_STORM, 80)).toBe(0);
  });
});

describe('faults', () => {
  it('reads device:start-end windows', () => {
    expect(parseFault('dropout', 'pool-radar:20-23.5')).toEqual({
      kind: 'dropout',
      deviceId: 'pool-radar',
      startHour: 20,
      endHour: 23.5,
    });
  });

  it.each(['pool-radar', 'pool-radar:5', 'Pool:1-2', 'pool-radar:4-2', 'pool-radar:2-2', ':1-2'])(
    'refuses "%s"',
    (text) => expect(() => parseFault('freeze', text)).toThrow(RangeError),
  );

  it('applies a fault from its start hour until (not including) its end hour', () => {
    const faults = [
      parseFault('freeze', 'inflow-gauge:2-4'),
      parseFault('dropout', 'inflow-gauge:3-5'),
    ];
    expect(activeFault(faults, 'inflow-gauge', 1.99)).toBeNull();
    expect(activeFault(faults, 'inflow-gauge', 2)).toBe('freeze');
    expect(activeFault(faults, 'inflow-gauge', 3.5)).toBe('dropout');
    expect(activeFault(faults, 'inflow-gauge', 5)).toBeNull();
    expect(activeFault(faults, 'pool-radar', 3)).toBeNull();
  });

  it('names the known scenarios when asked for an unknown one', () => {
    expect(findScenario('demo-storm')).toBe(DEMO_STORM);
    expect(() => findScenario('dry-summer')).toThrow(/demo-storm/);
  });
});
