import { describe, expect, it } from 'vitest';
import { linearScale, recency } from './scales';

describe('plot scales', () => {
  it('maps the data onto the pixels with round ticks covering it', () => {
    const s = linearScale([204.3, 212.8], [0, 100]);
    expect(s.domain[0]).toBeLessThanOrEqual(204.3);
    expect(s.domain[1]).toBeGreaterThanOrEqual(212.8);
    expect(s(s.domain[0])).toBe(0);
    expect(s(s.domain[1])).toBe(100);
    expect(s.ticks.every((t) => Number.isInteger(t))).toBe(true);
  });

  it('survives a single value and no values', () => {
    expect(linearScale([5], [0, 10]).domain[1]).toBeGreaterThan(5);
    expect(linearScale([], [0, 10]).ticks.length).toBeGreaterThan(1);
  });

  it('shades by recency within the range', () => {
    expect(recency(0, 0, 10)).toBe(0);
    expect(recency(10, 0, 10)).toBe(1);
    expect(recency(5, 0, 10)).toBe(0.5);
    expect(recency(20, 0, 10)).toBe(1);
  });
});
