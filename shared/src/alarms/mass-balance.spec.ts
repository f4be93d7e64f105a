import { describe, expect, it } from 'vitest';
import { DEFAULT_MASS_BALANCE } from './settings.js';
import { massBalance } from './mass-balance.js';
import { TimeSeries } from './series.js';

const T0 = Date.UTC(2026, 2, 3, 0, 0, 0);
const MIN = 60_000;
/** A prismatic test reservoir: 1 km2 at every level, so storage = 1e6 (z - 100) m3. */
const storageAt = (z: number) => 1e6 * (z - 100);

function series(f: (t: number) => number, everyMs: number, hours = 6) {
  const s = new TimeSeries(8 * 3_600_000);
  for (let t = T0; t <= T0 + hours * 3_600_000; t += everyMs) s.push(t, f(t));
  return s;
}

describe('mass balance over a sliding window', () => {
  const now = T0 + 6 * 3_600_000;
  // inflow 50 m3/s, outflow 30 m3/s: the pool rises 20 m3/s / 1e6 m2 = 0.072 m/h
  const pool = (t: number) => 110 + (0.072 * (t - T0)) / 3_600_000;

  it('closes exactly when storage change equals inflow minus outflow', () => {
    const r = massBalance({
      pools: [series(pool, 30_000)],
      inflow: series(() => 50, MIN),
      outflow: series(() => 30, MIN),
      storageAt,
      limits: DEFAULT_MASS_BALANCE,
      nowMs: now,
    })!;
    expect(r.gauges).toBe(1);
    expect(r.residualFlow).toBeCloseTo(0, 9);
    expect(r.meanThroughflow).toBeCloseTo(80, 9);
    expect(r.tolerance).toBeCloseTo(1 + 0.02 * 80, 9);
    // the window is 3 h between the mid-points of its 15-minute ends
    expect((r.toMs - r.fromMs) / MIN).toBeCloseTo(180, 6);
    expect(r.measuredChange).toBeCloseTo(20 * 180 * 60, 3);
  });

  it('an outflow gauge reading 4 m3/s high shows as 4 m3/s extra water; gauge offsets cancel', () => {
    const r = massBalance({
      pools: [series((t) => pool(t) + 0.012, 30_000), series((t) => pool(t) - 0.008, 30_000)],
      inflow: series(() => 50, MIN),
      outflow: series(() => 34, MIN),
      storageAt,
      limits: DEFAULT_MASS_BALANCE,
      nowMs: now,
    })!;
    expect(r.gauges).toBe(2);
    expect(r.residualFlow).toBeCloseTo(4, 9);
  });

  it('says nothing without a record at both ends, or across a hole in a flow series', () => {
    const args = {
      pools: [series(pool, 30_000)],
      inflow: series(() => 50, MIN),
      outflow: series(() => 30, MIN),
      storageAt,
      limits: DEFAULT_MASS_BALANCE,
    };
    expect(massBalance({ ...args, nowMs: T0 + 2 * 3_600_000 })).toBeNull();
    const holed = new TimeSeries(8 * 3_600_000);
    for (let t = T0; t <= now; t += MIN)
      if (t < T0 + 4 * 3_600_000 || t > T0 + 4.5 * 3_600_000) holed.push(t, 50);
    expect(massBalance({ ...args, inflow: holed, nowMs: now })).toBeNull();
  });
});
