import { describe, expect, it } from 'vitest';
import { vNotchHead } from '../hydraulics/v-notch.js';
import { DEMO_RESERVOIR, type ReservoirDefinition } from '../reservoirs/index.js';
import { LagFilter } from './engine-state.js';
import { AlarmEngine } from './engine.js';
import { baselineFlow } from './evaluate-dam-safety.js';
import { FakeSite, HOUR_MS, MINUTE_MS, type FakeSiteOptions } from './testing/fake-site.js';

const T0 = Date.UTC(2026, 2, 3, 0, 0, 0);
const site = (options: FakeSiteOptions = {}, def: ReservoirDefinition = DEMO_RESERVOIR) =>
  new FakeSite(new AlarmEngine(def, { startMs: T0 }), def, T0, options);
const hours = (t: number) => (t - T0) / HOUR_MS;
const minutes = (t: number) => (t - T0) / MINUTE_MS;
const LEFT = DEMO_RESERVOIR.seepageWeirs![0]!;

/** True seepage following a pool with a first-order lag, as the baseline says it should. */
function laggedSeepage(pool: (t: number) => number, lagHours: number) {
  const f = new LagFilter(lagHours * HOUR_MS);
  let t = T0;
  return (until: number) => {
    for (; t <= until; t += MINUTE_MS) f.update(t, pool(t));
    return vNotchHead(baselineFlow(LEFT, f.value!));
  };
}

describe('seepage at a weir', () => {
  it('raises when the flow from the weir head (V-notch) passes the limit for the on-delay, clears below the deadband', () => {
    const flow = (t: number) => (hours(t) >= 2 && hours(t) < 5 ? 0.016 : 0.005);
    const s = site({
      signals: { 'seepage.left': (t) => vNotchHead(flow(t)) },
      noise: { 'seepage.left': 0.0001 },
    });
    s.run(T0 + 6 * HOUR_MS);
    const [up, down] = s.of('seepage-high.weir-left');
    // 16 l/s from 2 h, read every 5 min; on-delay 30 min
    expect(up?.change).toBe('raise');
    expect(minutes(up!.timeMs)).toBeGreaterThanOrEqual(150);
    expect(minutes(up!.timeMs)).toBeLessThanOrEqual(156);
    expect(up!.message).toMatch(/16\.\d l\/s/);
    expect(down?.change).toBe('clear');
    expect(minutes(down!.timeMs)).toBeLessThanOrEqual(306);
  });

  it('raises when seepage rises against its baseline while the pool holds still', () => {
    // the baseline needs 2 x 4 h of pool record first; then 9 l/s where 5 l/s is the baseline
    const flow = (t: number) => (hours(t) >= 10 ? 0.009 : baselineFlow(LEFT, 204.5));
    const s = site({ signals: { 'seepage.left': (t) => vNotchHead(flow(t)) } });
    s.run(T0 + 12 * HOUR_MS);
    const [up] = s.of('seepage-baseline.weir-left');
    expect(up?.change).toBe('raise');
    expect(minutes(up!.timeMs)).toBeGreaterThanOrEqual(600 + 30);
    expect(minutes(up!.timeMs)).toBeLessThanOrEqual(600 + 36);
    expect(s.of('seepage-high.weir-left')).toEqual([]);
  });

  it('a fast rise and fall of the pool, which seepage follows with its lag, is no change of behaviour', () => {
    // a flood surcharge: 8 m up in 4 h, 2 h at the top, then drawn down 12 m over 12 h
    const pool = (t: number) => {
      const h = hours(t);
      if (h < 10) return 204.5;
      if (h < 14) return 204.5 + 2 * (h - 10);
      if (h < 16) return 212.5;
      return Math.max(200.5, 212.5 - (h - 16));
    };
    const options = () => ({ pool, signals: { 'seepage.left': laggedSeepage(pool, 4) } });
    // a tight baseline (10 % + 0.5 l/s), where the lag matters most
    const tight = (lagHours: number): ReservoirDefinition => ({
      ...DEMO_RESERVOIR,
      seepageWeirs: [
        {
          ...LEFT,
          baseline: { ...LEFT.baseline, lagHours, tolerance: 0.1, toleranceFlow: 0.0005 },
        },
        DEMO_RESERVOIR.seepageWeirs![1]!,
      ],
    });
    const s = site(options(), tight(4));
    s.run(T0 + 30 * HOUR_MS);
    expect(s.of('seepage-baseline.weir-left')).toEqual([]);
    // compared with the pool as it is now, the same seepage looks high on the falling limb
    const naive = site(options(), tight(0));
    naive.run(T0 + 30 * HOUR_MS);
    const wrong = naive.of('seepage-baseline.weir-left')[0];
    expect(wrong?.change).toBe('raise');
    expect(hours(wrong!.timeMs)).toBeGreaterThan(16);
  });
});

describe('foundation piezometers', () => {
  it('raise above their level after the on-delay and clear below it less the deadband', () => {
    const p1 = DEMO_RESERVOIR.piezometers![0]!;
    const level = (t: number) => (hours(t) >= 2 && hours(t) < 4 ? p1.maxLevel + 0.3 : 188);
    const s = site({ signals: { 'piezometer.1': level } });
    s.run(T0 + 5 * HOUR_MS);
    const [up, down] = s.of('piezometer-high.p1');
    expect(up?.change).toBe('raise');
    expect(minutes(up!.timeMs)).toBeGreaterThanOrEqual(135);
    expect(minutes(up!.timeMs)).toBeLessThanOrEqual(141);
    expect(down?.change).toBe('clear');
    expect(minutes(down!.timeMs)).toBeLessThanOrEqual(246);
  });
});

describe('mass balance', () => {
  // 2.6 km2 at 204.5 m: 5 m3/s leaving unmeasured lowers the pool about 7 mm an hour
  const area = 2_612_000;
  const leak = 5;

  it('raises when the pool falls by more than the measured flows explain, persistently', () => {
    const pool = (t: number) => 204.5 - (Math.max(0, hours(t) - 4) * 3600 * leak) / area;
    const s = site({ pool });
    s.run(T0 + 12 * HOUR_MS);
    const [up] = s.of('mass-balance');
    expect(up?.change).toBe('raise');
    // the 3 h window must first fill with the leak (tolerance 1 + 2 % of 60 = 2.2 m3/s), then 1 h on-delay
    expect(hours(up!.timeMs)).toBeGreaterThan(4 + 1);
    expect(hours(up!.timeMs)).toBeLessThan(4 + 3.5);
    expect(up!.value).toBeLessThan(-leak * 0.8);
    expect(up!.message).toMatch(/missing/);
  });

  it('a residual that does not persist for the on-delay raises nothing', () => {
    // wind set-up lifts both gauges 5 cm for 15 minutes: the residual passes the tolerance while
    // the window's end (and, 3 h later, its start) averages over it, under an hour each time
    const pool = (t: number) => (hours(t) >= 5 && hours(t) < 5.25 ? 204.55 : 204.5);
    const s = site({ pool });
    s.run(T0 + 12 * HOUR_MS);
    expect(s.of('mass-balance')).toEqual([]);
    const judged = [];
    const probe = site({ pool });
    for (let t = T0 + 5 * HOUR_MS; t < T0 + 9 * HOUR_MS; t += 5 * MINUTE_MS) {
      probe.run(t);
      judged.push(Math.abs(probe.engine.lastMassBalance?.residualFlow ?? 0));
    }
    expect(Math.max(...judged)).toBeGreaterThan(2.2);
  });

  it('judges nothing across a hole in the inflow record', () => {
    const pool = (t: number) => 204.5 - (Math.max(0, hours(t) - 4) * 3600 * leak) / area;
    const s = site({ pool, silent: { inflow: (t) => hours(t) >= 4 } });
    s.run(T0 + 10 * HOUR_MS);
    expect(s.of('mass-balance')).toEqual([]);
    expect(s.engine.lastMassBalance).toBeNull();
  });
});
