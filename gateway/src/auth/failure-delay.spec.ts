import { FailureDelay } from './failure-delay';

describe('FailureDelay', () => {
  let now = 0;
  const clock = () => now;
  const make = () =>
    new FailureDelay({ freeFailures: 5, firstDelayS: 1, maxDelayS: 900, maxEntries: 3 }, clock);

  beforeEach(() => (now = 1_000_000));

  it('lets the first failures through, then waits 1 s doubling up to the cap', () => {
    const d = make();
    const waits = Array.from({ length: 16 }, () => {
      const w = d.failed('operator');
      now += w * 1000;
      return w;
    });
    expect(waits).toEqual([0, 0, 0, 0, 1, 2, 4, 8, 16, 32, 64, 128, 256, 512, 900, 900]);
  });

  it('refuses during the wait and not after it', () => {
    const d = make();
    for (let i = 0; i < 7; i++) d.failed('engineer');
    expect(d.retryAfterS('engineer')).toBe(4);
    now += 3_500;
    expect(d.retryAfterS('engineer')).toBe(1);
    now += 500;
    expect(d.retryAfterS('engineer')).toBe(0);
  });

  it('forgets an account on success and keeps accounts apart', () => {
    const d = make();
    for (let i = 0; i < 6; i++) d.failed('liaison');
    expect(d.retryAfterS('reviewer')).toBe(0);
    d.succeeded('liaison');
    expect(d.retryAfterS('liaison')).toBe(0);
    expect(d.failed('liaison')).toBe(0);
  });

  it('forgets old failures, and holds a bounded number of accounts', () => {
    const d = make();
    for (let i = 0; i < 5; i++) d.failed('a');
    now += 25 * 3600_000;
    expect(d.failed('a')).toBe(0);
    for (const k of ['b', 'c', 'd']) for (let i = 0; i < 6; i++) d.failed(k);
    // 'a' was the oldest of four: dropped
    for (let i = 0; i < 4; i++) expect(d.failed('a')).toBe(0);
  });
});
