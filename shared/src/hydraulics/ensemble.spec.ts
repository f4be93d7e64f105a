import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR } from '../reservoirs/demo.js';
import { memberMultipliers, runEnsemble } from './ensemble.js';
import { createPrng } from './prng.js';
import { quantiles } from './quantile.js';
import { routeStorageIndication } from './route.js';
import { createStorageCurve } from './storage-curve.js';
import { gammaStorm } from './testing/fixtures.js';

const H = 3600;
const storage = createStorageCurve(DEMO_RESERVOIR.storageTable);
const inflow = gammaStorm({
  base: 50,
  peak: 1200,
  peakTime: 10 * H,
  shape: 3.7,
  duration: 24 * H,
  dt: 600,
});
const opts = {
  storage,
  structures: DEMO_RESERVOIR.structures,
  inflow,
  initialElevation: 204.5,
  duration: 24 * H,
  dt: 300,
  initialSettings: { gates: { 'gate-1': 2, 'gate-2': 2, 'gate-3': 2 }, valves: {} },
};

describe('seeded PRNG', () => {
  it('is reproducible and seed-dependent', () => {
    const a = createPrng(42);
    const b = createPrng(42);
    const c = createPrng('42x');
    const xa = Array.from({ length: 5 }, () => a.next());
    expect(Array.from({ length: 5 }, () => b.next())).toEqual(xa);
    expect(Array.from({ length: 5 }, () => c.next())).not.toEqual(xa);
  });
  it('gives uniform [0,1) and standard normal deviates (moments within 4 standard errors)', () => {
    const p = createPrng('moments');
    const n = 200_000;
    let su = 0;
    let sn = 0;
    let sn2 = 0;
    let outside = 0;
    for (let i = 0; i < n; i++) {
      const u = p.next();
      if (!(u >= 0 && u < 1)) outside++;
      su += u;
      const z = p.normal();
      sn += z;
      sn2 += z * z;
    }
    expect(outside).toBe(0);
    expect(Math.abs(su / n - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(sn / n)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(sn2 / n - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
  });
});

describe('member multipliers (lognormal, AR(1) in time)', () => {
  const spread = { sigma: 0.3, growth: 6 * H, correlation: 6 * H, interval: 900 };
  const steps = 96;
  const dt = 900;
  const members = 4000;
  const p = createPrng('mult');
  const all = Array.from({ length: members }, () =>
    memberMultipliers(p, steps, dt, spread, new Float64Array(steps + 1)),
  );
  it('is exactly 1 at lead 0 and has mean 1 (mean-preserving) at long lead', () => {
    expect(all.every((m) => m[0] === 1)).toBe(true);
    const mean = all.reduce((s, m) => s + m[steps]!, 0) / members;
    expect(Math.abs(mean - 1)).toBeLessThan(0.02);
  });
  it('draws at the noise interval and is linear between draws', () => {
    const m = memberMultipliers(
      createPrng('knots'),
      16,
      300,
      { ...spread, interval: 1200 },
      new Float64Array(17),
    );
    for (const k of [0, 4, 8, 12]) {
      for (let j = 1; j < 4; j++)
        expect(m[k + j]).toBeCloseTo(m[k]! + ((m[k + 4]! - m[k]!) * j) / 4, 12);
    }
    expect(m[4]).not.toBeCloseTo(m[8]!, 6);
  });
  it('has sd(ln m) = sigma (1 - e^(-L/growth)) and lag correlation e^(-lag/correlation)', () => {
    const ln = (n: number) => all.map((m) => Math.log(m[n]!));
    const sd = (xs: number[]) => {
      const mu = xs.reduce((a, b) => a + b, 0) / xs.length;
      return Math.sqrt(xs.reduce((a, b) => a + (b - mu) ** 2, 0) / (xs.length - 1));
    };
    expect(sd(ln(steps))).toBeCloseTo(0.3 * (1 - Math.exp(-16)), 1);
    expect(
      Math.abs(sd(ln(24)) - 0.3 * (1 - Math.exp(-1))) / (0.3 * (1 - Math.exp(-1))),
    ).toBeLessThan(0.05);
    const a = ln(72);
    const b = ln(96); // 6 h apart
    const ma = a.reduce((x, y) => x + y, 0) / members;
    const mb = b.reduce((x, y) => x + y, 0) / members;
    let cov = 0;
    for (let i = 0; i < members; i++) cov += (a[i]! - ma) * (b[i]! - mb);
    const corr = cov / (members - 1) / (sd(a) * sd(b));
    expect(Math.abs(corr - Math.exp(-1))).toBeLessThan(0.05);
  });
});

describe('runEnsemble on the demo reservoir', () => {
  const thresholds = DEMO_RESERVOIR.thresholds;
  const r = runEnsemble({ ...opts, members: 200, seed: 'storm-1', thresholds });
  it('orders the bands p10 <= p50 <= p90 at every time, and starts at the present level', () => {
    const [p10, p50, p90] = r.elevation;
    for (let i = 0; i < r.time.length; i++) {
      expect(p10![i]).toBeLessThanOrEqual(p50![i]!);
      expect(p50![i]).toBeLessThanOrEqual(p90![i]!);
    }
    expect(p10![0]).toBeCloseTo(204.5, 4);
    expect(p90![0]).toBeCloseTo(204.5, 4);
    expect(p90![100]! - p10![100]!).toBeGreaterThan(0.05);
    expect(r.band(0.9)).toBe(p90);
  });
  it('is reproducible with the same seed and changes with another', () => {
    const again = runEnsemble({ ...opts, members: 200, seed: 'storm-1' });
    expect(Array.from(again.elevation[2]!)).toEqual(Array.from(r.elevation[2]!));
    const other = runEnsemble({ ...opts, members: 200, seed: 'storm-2' });
    expect(other.peakElevation[2]).not.toBe(r.peakElevation[2]);
  });
  it('with no spread every member is the deterministic routing', () => {
    const flat = runEnsemble({ ...opts, members: 5, seed: 1, spread: { sigma: 0 } });
    const det = routeStorageIndication(opts);
    expect(flat.peakElevation[0]).toBeCloseTo(det.peakElevation, 5);
    expect(flat.peakElevation[2]).toBeCloseTo(det.peakElevation, 5);
  });
  it('gives exceedance probabilities that fall as the level rises, consistent with the peak quantiles', () => {
    const probs = r.exceedance.map((e) => e.probability);
    for (let i = 1; i < probs.length; i++) expect(probs[i]).toBeLessThanOrEqual(probs[i - 1]!);
    const watch = r.exceedance.find((e) => e.id === 'watch')!;
    if (r.peakElevation[0]! >= watch.elevation)
      expect(watch.probability).toBeGreaterThanOrEqual(0.9);
    expect(quantiles([3, 1, 2, 4], [0, 0.5, 1])).toEqual([1, 2.5, 4]);
  });
});
