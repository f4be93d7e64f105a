import { slopePerHour } from '@stillwell/shared/telemetry';
import { maxRateOfRise, peakOf } from './reading-figures';

// The live status's definition (shared slopePerHour) applied at each reading by brute force.
function bruteForce(points: Array<{ t: number; v: number }>, windowMs: number, min: number) {
  let best: { value: number; t: number } | null = null;
  for (const p of points) {
    const span = points.filter((q) => q.t <= p.t && q.t >= p.t - windowMs);
    if (span.length < min) continue;
    const s = slopePerHour(span);
    if (s !== null && (!best || s > best.value)) best = { value: s, t: p.t };
  }
  return best;
}

describe('reading figures', () => {
  const start = Date.parse('2026-12-01T00:00:00Z');

  it('peakOf keeps the first of equal highs', () => {
    const pts = [1, 4, 2, 4, 3].map((v, i) => ({ t: start + i * 1000, v }));
    expect(peakOf(pts)).toEqual({ t: start + 1000, v: 4 });
    expect(peakOf([])).toBeNull();
  });

  it('the largest rate of rise equals the 30-minute least-squares slope found by brute force', () => {
    // a rise that speeds up, then slows: 2 minutes apart, with an irregular wobble
    const pts = Array.from({ length: 300 }, (_, i) => ({
      t: start + i * 120_000 + (i % 3) * 7_000,
      v: 204 + 3 / (1 + Math.exp(-(i - 150) / 20)) + 0.01 * Math.sin(i * 1.7),
    }));
    const got = maxRateOfRise(pts);
    const want = bruteForce(pts, 30 * 60_000, 3);
    expect(want).not.toBeNull();
    expect(got!.t).toBe(want!.t);
    expect(got!.value).toBeCloseTo(want!.value, 9);
  });

  it('gives no rate with fewer than three readings or no time spread', () => {
    expect(
      maxRateOfRise([
        { t: start, v: 1 },
        { t: start + 1000, v: 2 },
      ]),
    ).toBeNull();
    expect(maxRateOfRise([0, 1, 2].map(() => ({ t: start, v: 1 })))).toBeNull();
  });
});
