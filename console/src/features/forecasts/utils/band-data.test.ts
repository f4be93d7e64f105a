import { describe, expect, it } from 'vitest';
import { SITE_NOW } from '../../../testing/fixtures';
import { makeRun } from '../../../testing/forecast-fixtures';
import { forecastBand } from './band-data';

describe('forecastBand', () => {
  it('takes the run from its start to the chart horizon, x in seconds, band edges in order', () => {
    const band = forecastBand(makeRun(), 'si', SITE_NOW, 2 * 3600);
    // 2 h at 5-minute points, both ends included
    expect(band.t).toHaveLength(25);
    expect(band.t[0]).toBe(SITE_NOW / 1000);
    expect(band.t.at(-1)).toBe(SITE_NOW / 1000 + 7200);
    expect(band.median[12]).toBeCloseTo(207.1, 9);
    expect(band.low[24]!).toBeLessThan(band.median[24]!);
    expect(band.high[24]!).toBeGreaterThan(band.median[24]!);
    expect(band.aheadS).toBe(7200);
  });

  it('converts to the display units', () => {
    const band = forecastBand(makeRun(), 'us', SITE_NOW, 300);
    expect(band.median[0]).toBeCloseTo(207 / 0.3048, 6);
    expect(band.inflow[0]).toBeCloseTo(850 / 0.3048 ** 3, 3);
  });

  it('leaves out points that are not numbers, and swaps edges that came out crossed', () => {
    const run = makeRun();
    run.series.p90[1] = Number.NaN;
    run.series.p10[2] = 300;
    const band = forecastBand(run, 'si', SITE_NOW, 900);
    expect(band.t).toEqual([0, 600, 900].map((s) => SITE_NOW / 1000 + s));
    expect(band.high[1]).toBe(300);
    expect(band.low[1]).toBeCloseTo(run.series.p90[2]!, 9);
  });

  it('cuts at the site now plus the horizon even when the run is older', () => {
    const band = forecastBand(makeRun(), 'si', SITE_NOW + 3600_000, 3600);
    expect(band.t.at(-1)).toBe(SITE_NOW / 1000 + 7200);
  });
});
