import { describe, expect, it } from 'vitest';
import {
  hydrographForecast,
  leastSquaresSlope,
  linearTrendForecast,
  persistenceForecast,
  recessionForecast,
} from './forecast.js';

const H = 3600;
const obs = (f: (t: number) => number, from: number, to: number, every = 900) => {
  const out = [];
  for (let t = from; t <= to; t += every) out.push({ t, q: f(t) });
  return out;
};

describe('inflow forecasts', () => {
  it('persistence holds the current flow on the grid now + k dt', () => {
    const f = persistenceForecast(
      obs((t) => 100 + t / 360, 0, 6 * H),
      { horizon: 2 * H, dt: 600 },
    );
    expect(f.t.length).toBe(13);
    expect(f.t[0]).toBe(6 * H);
    expect(f.t[12]).toBe(8 * H);
    expect(Array.from(f.q).every((q) => q === 160)).toBe(true);
  });
  it('linear trend continues the least-squares slope from the current flow, floored at 0', () => {
    const rising = linearTrendForecast(
      obs((t) => 100 + t / 360, 0, 6 * H),
      { horizon: 3 * H, dt: 900 },
    );
    expect(rising.parameters.slope).toBeCloseTo(1 / 360, 12);
    expect(rising.q[rising.q.length - 1]).toBeCloseTo(160 + (3 * H) / 360, 9);
    const falling = linearTrendForecast(
      obs((t) => 100 - t / 360, 0, 6 * H),
      { horizon: 12 * H, dt: 900 },
    );
    expect(Math.min(...falling.q)).toBe(0);
    expect(falling.notes.join(' ')).toContain('reaches zero');
  });
  it('least squares on noisy data recovers a known slope (computed)', () => {
    const ts = [0, 1, 2, 3, 4];
    const qs = [1, 3.1, 4.9, 7.2, 8.8]; // about 1 + 2t
    const { slope, intercept } = leastSquaresSlope(ts, qs);
    expect(slope).toBeCloseTo(1.97, 2);
    expect(intercept).toBeCloseTo(1.06, 2);
  });
  it('recession fits k from the falling limb and decays to the baseflow', () => {
    const k = 10 * H;
    const record = obs(
      (t) => (t < 5 * H ? 100 + 100 * (t / (5 * H)) : 20 + 180 * Math.exp(-(t - 5 * H) / k)),
      0,
      12 * H,
    );
    const f = recessionForecast(record, { horizon: 24 * H, dt: H, baseflow: 20 });
    expect(f.parameters.constant).toBeCloseTo(k, 3);
    const q0 = record[record.length - 1]!.q;
    expect(f.q[10]).toBeCloseTo(20 + (q0 - 20) * Math.exp(-1), 6);
    expect(f.notes).toEqual([]);
  });
  it('recession refuses to guess k on a rising record, and says the peak has not passed', () => {
    const rising = obs((t) => 100 + t / 100, 0, 6 * H);
    expect(() => recessionForecast(rising, { horizon: H, dt: 600 })).toThrow(
      'cannot estimate the recession constant',
    );
    const f = recessionForecast(rising, { horizon: H, dt: 600, constant: 5 * H });
    expect(f.notes[0]).toContain('still rising');
  });
  it('a user hydrograph is placed from now and held past its end, with a note', () => {
    const f = hydrographForecast(
      [
        { t: 0, q: 10 },
        { t: H, q: 30 },
      ],
      { now: 100 * H, horizon: 2 * H, dt: 1800 },
    );
    expect(Array.from(f.q)).toEqual([10, 20, 30, 30, 30]);
    expect(f.notes.join(' ')).toContain('ends before the horizon');
  });
  it('rejects a record with problems, naming the point', () => {
    expect(() =>
      persistenceForecast(
        [
          { t: 0, q: 1 },
          { t: 0, q: 2 },
        ],
        { horizon: H, dt: 60 },
      ),
    ).toThrow('observed point 2: time must be after point 1');
    expect(() => persistenceForecast([{ t: 0, q: -1 }], { horizon: H, dt: 60 })).toThrow(
      'observed point 1: flow',
    );
    expect(() => persistenceForecast([], { horizon: H, dt: 60 })).toThrow('at least 1');
  });
});
