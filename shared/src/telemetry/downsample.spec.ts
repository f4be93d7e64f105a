import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { downsampleMinMax, type SeriesPoint } from './downsample.js';

const series = fc
  .array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 2000 })
  .map((vs) => vs.map((v, i): SeriesPoint => ({ t: i * 1000, v })));

describe('downsampleMinMax', () => {
  it('keeps the true maximum and minimum of the series and bounds the point count', () => {
    fc.assert(
      fc.property(series, fc.integer({ min: 1, max: 300 }), (points, buckets) => {
        const out = downsampleMinMax(points, buckets);
        expect(out.length).toBeLessThanOrEqual(Math.min(points.length, 2 * buckets));
        const max = Math.max(...points.map((p) => p.v));
        const min = Math.min(...points.map((p) => p.v));
        expect(Math.max(...out.map((p) => p.v))).toBe(max);
        expect(Math.min(...out.map((p) => p.v))).toBe(min);
      }),
    );
  });

  it('returns points in time order, each one taken from the input', () => {
    fc.assert(
      fc.property(series, fc.integer({ min: 1, max: 50 }), (points, buckets) => {
        const out = downsampleMinMax(points, buckets);
        for (let i = 1; i < out.length; i++) expect(out[i]!.t).toBeGreaterThan(out[i - 1]!.t);
        for (const p of out) expect(points[p.t / 1000]).toBe(p);
      }),
    );
  });

  it('keeps a one-sample spike inside a long flat record', () => {
    const points = Array.from({ length: 100_000 }, (_, i) => ({ t: i, v: i === 54_321 ? 9 : 1 }));
    const out = downsampleMinMax(points, 500);
    expect(out.length).toBeLessThanOrEqual(1000);
    expect(out).toContainEqual({ t: 54_321, v: 9 });
  });

  it('refuses a bucket count that is not a positive integer', () => {
    expect(() => downsampleMinMax([{ t: 0, v: 0 }], 0)).toThrow(
      /buckets must be a positive integer/,
    );
  });
});
