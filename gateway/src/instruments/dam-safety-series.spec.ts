import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { vNotchHead } from '@stillwell/shared/hydraulics';
import { laggedPool, poolAt, thin, weirSeries } from './dam-safety-series';

const H = 3_600_000;
const pool = { t: [0, H, 2 * H, 10 * H], v: [200, 201, 202, 210] };

describe('dam-safety series', () => {
  it('puts the pool beside each reading, linear between pool readings, none across a hole', () => {
    expect(poolAt(pool, 0.5 * H)).toBeCloseTo(200.5, 9);
    expect(poolAt(pool, 2 * H + 20 * 60_000)).toBe(202); // just after the last reading before a hole
    expect(poolAt(pool, 6 * H)).toBeNull();
    expect(poolAt({ t: [], v: [] }, 0)).toBeNull();
  });

  it('lags the pool like a first-order filter, and says nothing before it has warmed up', () => {
    const steps = {
      t: Array.from({ length: 200 }, (_, i) => i * 600_000),
      v: Array.from({ length: 200 }, (_, i) => (i < 50 ? 200 : 204)),
    };
    const [early, atStep, later] = laggedPool(steps, 2, [H, 50 * 600_000 + 2 * H, 190 * 600_000]);
    expect(early).toBeNull();
    // two hours (one time constant) after a 4 m step: about 63 % of it
    expect(atStep! - 200).toBeGreaterThan(4 * 0.6);
    expect(atStep! - 200).toBeLessThan(4 * 0.68);
    expect(later).toBeCloseTo(204, 3);
  });

  it('thins long series to the drawable number of points, keeping the newest', () => {
    const long = {
      t: Array.from({ length: 10_000 }, (_, i) => i),
      v: Array.from({ length: 10_000 }, (_, i) => i),
    };
    const thinned = thin(long, 1000);
    expect(thinned.t.length).toBeLessThanOrEqual(1000);
    expect(thinned.t.at(-1)).toBe(9999);
  });

  it('converts weir heads to flows with the V-notch equation', () => {
    const weir = DEMO_RESERVOIR.seepageWeirs![0]!;
    const s = weirSeries(weir, { t: [H], v: [vNotchHead(0.0247)] }, pool, 0);
    expect(s.flow[0]).toBeCloseTo(0.0247, 9);
    expect(s.pool[0]).toBeCloseTo(201, 9);
    expect(s.curve.length).toBeGreaterThan(10);
  });
});
