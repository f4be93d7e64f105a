import { describe, expect, it } from 'vitest';
import { createPrng } from '../hydraulics/prng.js';
import { Debouncer, limitVerdict, type Transition } from './detector.js';

const S = 1000;

function run(
  values: readonly number[],
  stepMs: number,
  limit: number,
  deadband: number,
  onDelayMs: number,
) {
  const d = new Debouncer(onDelayMs);
  const events: Array<{ i: number; change: Transition }> = [];
  values.forEach((v, i) => {
    const change = d.update(limitVerdict(v, limit, deadband), i * stepMs);
    if (change) events.push({ i, change });
  });
  return events;
}

describe('limit with deadband and on-delay', () => {
  it('raises only after the value has stayed above the limit for the on-delay', () => {
    // readings every 30 s; above 205.5 from reading 2; on-delay 120 s
    const values = [205.4, 205.45, 205.6, 205.6, 205.6, 205.6, 205.6, 205.6];
    expect(run(values, 30 * S, 205.5, 0.05, 120 * S)).toEqual([{ i: 6, change: 'raise' }]);
  });

  it('a dip under the limit restarts the on-delay', () => {
    const values = [205.6, 205.6, 205.6, 205.49, 205.6, 205.6, 205.6, 205.6, 205.6];
    expect(run(values, 30 * S, 205.5, 0.05, 120 * S)).toEqual([{ i: 8, change: 'raise' }]);
  });

  it('clears only below limit - deadband', () => {
    const values = [205.6, 205.46, 205.455, 205.449];
    expect(run(values, 30 * S, 205.5, 0.05, 0)).toEqual([
      { i: 0, change: 'raise' },
      { i: 3, change: 'clear' },
    ]);
  });

  it('does not chatter on a noisy signal at the limit (1.2 cm gauge noise, 5 cm deadband, 2 min on-delay)', () => {
    const rng = createPrng('pool-noise');
    const values = Array.from({ length: 2880 }, () => 205.5 + 0.012 * rng.normal()); // 24 h at 30 s
    const events = run(values, 30 * S, 205.5, 0.05, 120 * S);
    // without the deadband and on-delay the same signal crosses the limit hundreds of times
    const bare = run(values, 30 * S, 205.5, 0, 0);
    expect(bare.length).toBeGreaterThan(200);
    expect(events.length).toBeLessThanOrEqual(1);
  });

  it('holds through missing values: neither raises nor clears on unknown', () => {
    const d = new Debouncer(60 * S);
    expect(d.update('set', 0)).toBeNull();
    expect(d.update('unknown', 30 * S)).toBeNull();
    expect(d.update('set', 60 * S)).toBe('raise');
    expect(d.update('unknown', 90 * S)).toBeNull();
    expect(d.active).toBe(true);
  });

  it('judges low limits the other way round', () => {
    expect(limitVerdict(3000, 10800, 900, 'low')).toBe('set');
    expect(limitVerdict(11000, 10800, 900, 'low')).toBe('deadband');
    expect(limitVerdict(12000, 10800, 900, 'low')).toBe('reset');
    expect(limitVerdict(null, 1, 0)).toBe('unknown');
    expect(limitVerdict(Number.NaN, 1, 0)).toBe('unknown');
  });
});
