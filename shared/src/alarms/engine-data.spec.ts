import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR } from '../reservoirs/index.js';
import { AlarmEngine } from './engine.js';
import {
  FakeSite,
  HOUR_MS,
  MINUTE_MS,
  type FakeSiteOptions,
  type Signal,
} from './testing/fake-site.js';

const T0 = Date.UTC(2026, 2, 3, 0, 0, 0);
const site = (signals: Record<string, Signal> = {}, options: FakeSiteOptions = {}) =>
  new FakeSite(new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 }), DEMO_RESERVOIR, T0, {
    signals,
    ...options,
  });
const during =
  (fromH: number, toH: number, inside: number | null, outside: number) => (t: number) => {
    const h = (t - T0) / HOUR_MS;
    return h >= fromH && h < toH ? inside : outside;
  };
const minutesFromStart = (t: number) => (t - T0) / MINUTE_MS;

describe('stale channels', () => {
  const between = (fromH: number, toH: number) => (t: number) => {
    const h = (t - T0) / HOUR_MS;
    return h >= fromH && h < toH;
  };

  it('raises for the silent device once its channel is past its stale limit, and clears when it reports', () => {
    // the radar falls silent from 1 h to 2 h; its stale limit is 180 s, then 60 s grace
    const s = site({}, { silent: { 'pool.radar': between(1, 2) } });
    s.run(T0 + 3 * HOUR_MS, 10_000);
    const [up, down] = s.of('stale.pool-radar');
    expect(up?.change).toBe('raise');
    expect(minutesFromStart(up!.timeMs)).toBeGreaterThanOrEqual(60 + 3);
    expect(minutesFromStart(up!.timeMs)).toBeLessThanOrEqual(60 + 5);
    expect(down?.change).toBe('clear');
    expect(minutesFromStart(down!.timeMs)).toBeLessThanOrEqual(121);
    // the pool carried on from the second gauge: nothing else
    expect(s.changes.filter((c) => c.conditionId !== 'stale.pool-radar')).toEqual([]);
  });

  it('one alarm for the whole feed when every instrument goes quiet, not one per device', () => {
    const s = site({}, { silent: { '*': between(1, 3) } });
    s.run(T0 + 4 * HOUR_MS, 10_000);
    expect(s.changes.map((c) => `${c.change} ${c.conditionId}`)).toEqual([
      'raise telemetry-silent',
      'clear telemetry-silent',
    ]);
    const up = s.of('telemetry-silent')[0]!;
    expect(minutesFromStart(up.timeMs)).toBeLessThanOrEqual(60 + 4);
  });

  it('a feed arriving late as a whole singles out no device; a feed the gateway knows alive is not silent', () => {
    const engine = new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 });
    const s = new FakeSite(engine, DEMO_RESERVOIR, T0, {});
    s.run(T0 + HOUR_MS);
    // the gateway stalls: four site minutes pass with no new reading judged
    const late = T0 + HOUR_MS + 4 * MINUTE_MS;
    engine.noteFeedAlive(late);
    expect(engine.evaluate(late)).toEqual([]);
    // without word from the gateway the same stall is the whole feed gone quiet: one alarm, no device
    const other = new FakeSite(
      new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 }),
      DEMO_RESERVOIR,
      T0,
      {},
    );
    other.run(T0 + HOUR_MS);
    expect(other.engine.evaluate(late).map((c) => c.conditionId)).toEqual(['telemetry-silent']);
  });

  it('a channel that never reported counts as silent from the engine start', () => {
    const s = site({}, { silent: { rain: () => true } });
    s.run(T0 + HOUR_MS);
    // stale limit 1200 s + 60 s grace
    expect(s.of('stale.rain-gauge').map((c) => [c.change, minutesFromStart(c.timeMs)])).toEqual([
      ['raise', 21.5],
    ]);
  });
});

describe('frozen channels', () => {
  it('raises when a channel stays within its band for longer than its limit, and clears when it moves', () => {
    // the inflow gauge repeats 30.4 m3/s, good, from 1 h to 3 h; its limit is 60 min
    const s = site(
      { inflow: during(1, 3, 30.4, 30) },
      { noise: { inflow: during(1, 3, 0, 0.9) as (t: number) => number } },
    );
    s.run(T0 + 4 * HOUR_MS);
    const [up, down] = s.of('frozen.inflow');
    expect(up?.change).toBe('raise');
    expect(minutesFromStart(up!.timeMs)).toBeGreaterThanOrEqual(120);
    expect(minutesFromStart(up!.timeMs)).toBeLessThanOrEqual(121);
    expect(down?.change).toBe('clear');
    expect(minutesFromStart(down!.timeMs)).toBeGreaterThanOrEqual(180);
    expect(minutesFromStart(down!.timeMs)).toBeLessThanOrEqual(183);
  });

  it('healthy noise never looks frozen, and rain and gate positions are not checked', () => {
    const s = site({}, { noise: { rain: 0 } });
    s.run(T0 + 12 * HOUR_MS);
    expect(s.changes).toEqual([]);
    expect(
      s.engine.conditions.map((c) => c.id).filter((id) => /frozen\.(rain|gate|outlet)/.test(id)),
    ).toEqual([]);
  });
});

describe('out-of-range bursts', () => {
  it('a single out-of-range message is no alarm; three within 10 minutes are, clearing 30 min after the last', () => {
    const engine = new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 });
    const s = new FakeSite(engine, DEMO_RESERVOIR, T0, {});
    s.run(T0 + HOUR_MS);
    engine.noteOutOfRange('tailwater', T0 + HOUR_MS);
    s.run(T0 + 2 * HOUR_MS);
    expect(s.of('out-of-range.tailwater')).toEqual([]);
    for (const m of [0, 3, 6]) engine.noteOutOfRange('tailwater', T0 + 2 * HOUR_MS + m * MINUTE_MS);
    s.run(T0 + 4 * HOUR_MS);
    const [up, down] = s.of('out-of-range.tailwater');
    expect(up?.change).toBe('raise');
    expect(minutesFromStart(up!.timeMs)).toBeLessThanOrEqual(127);
    expect(down?.change).toBe('clear');
    expect(minutesFromStart(down!.timeMs)).toBeGreaterThan(126 + 30);
    expect(minutesFromStart(down!.timeMs)).toBeLessThanOrEqual(126 + 31);
  });
});

describe('external conditions (gate not following its command)', () => {
  it('are raised and cleared by their source, once each', () => {
    const engine = new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 });
    const raise = engine.setExternal('gate-not-following.gate-2', true, T0, {
      message: 'gate 2 at 1.2 m, commanded 4.5 m',
    });
    expect(raise).toMatchObject({ change: 'raise', conditionId: 'gate-not-following.gate-2' });
    expect(
      engine.setExternal('gate-not-following.gate-2', true, T0 + 1, { message: 'still' }),
    ).toBeNull();
    expect(engine.isActive('gate-not-following.gate-2')).toBe(true);
    expect(
      engine.setExternal('gate-not-following.gate-2', false, T0 + 2, { message: 'at 4.5 m' })
        ?.change,
    ).toBe('clear');
    expect(() => engine.setExternal('pool-high.watch', true, T0, { message: 'no' })).toThrow(
      /not an external/,
    );
    expect(() =>
      engine.setExternal('gate-not-following.gate-9', true, T0, { message: 'no' }),
    ).toThrow(RangeError);
  });
});
