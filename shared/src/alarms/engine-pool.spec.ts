import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR, type ReservoirDefinition } from '../reservoirs/index.js';
import { AlarmEngine } from './engine.js';
import { FakeSite, HOUR_MS, MINUTE_MS } from './testing/fake-site.js';

const T0 = Date.UTC(2026, 2, 3, 0, 0, 0);
const site = (
  options: ConstructorParameters<typeof FakeSite>[3] = {},
  def: ReservoirDefinition = DEMO_RESERVOIR,
) => new FakeSite(new AlarmEngine(def, { startMs: T0 }), def, T0, options);

/** Everything raised, by condition id: a quiet site raises nothing at all. */
const raised = (s: FakeSite) =>
  s.changes.filter((c) => c.change === 'raise').map((c) => c.conditionId);

describe('a reservoir at rest', () => {
  it('raises no alarm in a day', () => {
    const s = site();
    s.run(T0 + 24 * HOUR_MS);
    expect(raised(s)).toEqual([]);
  });
});

describe('pool above a threshold', () => {
  // up through the watch level (205.5 m) at 1 m/h from 205 m, 30 min at 206 m, then down again
  const pool = (t: number) => {
    const h = (t - T0) / HOUR_MS;
    if (h < 1) return 205 + h;
    if (h < 1.5) return 206;
    return Math.max(204.9, 206 - (h - 1.5));
  };

  it('raises after the on-delay once the pool is above it, and clears below it less the deadband', () => {
    const s = site({ pool, noise: { 'pool.radar': 0, 'pool.pressure': 0 } });
    s.run(T0 + 4 * HOUR_MS, 10_000);
    const [up, down] = s.of('pool-high.watch');
    // crosses 205.5 m at 30 min; on-delay 120 s; readings every 30 s
    expect(up?.change).toBe('raise');
    expect((up!.timeMs - T0) / MINUTE_MS).toBeGreaterThanOrEqual(32);
    expect((up!.timeMs - T0) / MINUTE_MS).toBeLessThanOrEqual(33);
    // falls below 205.45 m (the limit less the deadband) at 2 h 03 min; no off-delay
    expect(down?.change).toBe('clear');
    expect((down!.timeMs - T0) / MINUTE_MS).toBeGreaterThanOrEqual(123);
    expect((down!.timeMs - T0) / MINUTE_MS).toBeLessThanOrEqual(124);
    expect(s.of('pool-high.normal-max')).toEqual([]);
    expect(up!.message).toMatch(/pool 205\.5\d m \(pool\.radar\); Watch level 205\.50 m/);
  });

  it('a noisy pool sitting on the threshold for 12 hours raises it at most once', () => {
    const s = site({ pool: () => 205.5 });
    s.run(T0 + 12 * HOUR_MS);
    expect(s.of('pool-high.watch').filter((c) => c.change === 'raise').length).toBeLessThanOrEqual(
      1,
    );
  });

  it('takes the pool from the second gauge when the first is bad', () => {
    const s = site({
      pool: () => 206,
      quality: { 'pool.radar': () => 'bad' },
      noise: { 'pool.pressure': 0 },
    });
    s.run(T0 + 10 * MINUTE_MS);
    expect(s.of('pool-high.watch')[0]?.message).toMatch(/pool\.pressure/);
  });
});

describe('rate of rise', () => {
  const rising = (rate: number, fromH: number, toH: number) => (t: number) => {
    const h = Math.min(Math.max((t - T0) / HOUR_MS, fromH), toH);
    return 200 + rate * (h - fromH);
  };

  it('raises when the pool rises faster than the limit and clears once it slows', () => {
    const s = site({ pool: rising(0.6, 1, 4) });
    s.run(T0 + 6 * HOUR_MS);
    const [up, down] = s.of('rate-of-rise');
    expect(up?.change).toBe('raise');
    // the 30-minute slope passes 0.3 m/h about 15 min after the rise starts; on-delay 10 min
    expect((up!.timeMs - T0) / MINUTE_MS).toBeGreaterThan(60 + 10);
    expect((up!.timeMs - T0) / MINUTE_MS).toBeLessThan(60 + 30);
    expect(down?.change).toBe('clear');
    expect(down!.timeMs - T0).toBeGreaterThan(4 * HOUR_MS);
    expect(down!.timeMs - T0).toBeLessThan(4.5 * HOUR_MS);
  });

  it('a steady rise under the limit raises nothing', () => {
    const s = site({ pool: rising(0.2, 0, 12) });
    s.run(T0 + 12 * HOUR_MS);
    expect(s.of('rate-of-rise')).toEqual([]);
  });

  it('during first filling the stricter limit applies: 5 cm/h is too fast', () => {
    const def: ReservoirDefinition = {
      ...DEMO_RESERVOIR,
      alarms: {
        ...DEMO_RESERVOIR.alarms,
        rateOfRise: {
          ...DEMO_RESERVOIR.alarms!.rateOfRise!,
          firstFilling: { active: true, limit: 0.02, windowS: 21600 },
        },
      },
    };
    const filling = site({ pool: rising(0.05, 0, 24) }, def);
    filling.run(T0 + 12 * HOUR_MS);
    const up = filling.of('rate-of-rise')[0];
    expect(up?.change).toBe('raise');
    expect(up!.limit).toBe(0.02);
    expect(up!.message).toMatch(/first filling/);
    const usual = site({ pool: rising(0.05, 0, 24) });
    usual.run(T0 + 12 * HOUR_MS);
    expect(usual.of('rate-of-rise')).toEqual([]);
  });
});

describe('pool gauges disagreeing', () => {
  it('raises when one gauge drifts beyond the tolerance for the on-delay, clears when back', () => {
    const drift = (t: number) => {
      const h = (t - T0) / HOUR_MS;
      return h >= 2 && h < 4 ? 204.65 : 204.5;
    };
    const s = site({ signals: { 'pool.pressure': drift } });
    s.run(T0 + 6 * HOUR_MS);
    const [up, down] = s.of('gauge-disagreement');
    expect(up?.change).toBe('raise');
    // the 10-min means cross 0.10 m within about 4 min of the step; on-delay 10 min
    expect((up!.timeMs - T0) / MINUTE_MS).toBeGreaterThan(120 + 10);
    expect((up!.timeMs - T0) / MINUTE_MS).toBeLessThan(120 + 20);
    expect(down?.change).toBe('clear');
    expect((down!.timeMs - T0) / MINUTE_MS).toBeLessThan(240 + 15);
  });

  it('two healthy gauges 2 cm apart with their noise do not disagree', () => {
    const s = site({ signals: { 'pool.radar': () => 204.512, 'pool.pressure': () => 204.492 } });
    s.run(T0 + 24 * HOUR_MS);
    expect(s.of('gauge-disagreement')).toEqual([]);
  });
});
