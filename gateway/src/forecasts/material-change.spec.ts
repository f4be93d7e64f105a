import { forecastElevationAt, materialChange, type LastRunView } from './material-change';

const last: LastRunView = {
  openings: { 'gate-1': 0, 'low-level-outlet': 10 },
  inflowNow: 800,
  series: { startMs: 0, stepS: 300, elevation: [206, 206.3, 206.6] },
};
const quiet = {
  openings: {
    'gate-1': { value: 0.04, kind: 'gate' as const },
    'low-level-outlet': { value: 11.5, kind: 'valve' as const },
  },
  inflow: 870,
  pool: { elevation: 206.19, tMs: 150_000 },
};

describe('materialChange', () => {
  it('lets small changes pass: 4 cm of gate, 1.5 % of valve, 8.75 % of inflow, 4 cm of pool', () => {
    expect(forecastElevationAt(last.series, 150_000)).toBeCloseTo(206.15, 9);
    expect(materialChange(last, quiet)).toBeNull();
  });

  it('names a gate that moved, an inflow that changed and a pool that departed', () => {
    expect(
      materialChange(last, {
        ...quiet,
        openings: { ...quiet.openings, 'gate-1': { value: 0.3, kind: 'gate' } },
      }),
    ).toBe('gate-1 moved from 0.00 m to 0.30 m');
    expect(materialChange(last, { ...quiet, inflow: 890 })).toBe(
      'inflow 890.0 m3/s against 800.0 m3/s at the last run',
    );
    expect(materialChange(last, { ...quiet, pool: { elevation: 206.21, tMs: 150_000 } })).toBe(
      'pool 206.210 m departs from the forecast 206.150 m',
    );
  });

  it('ignores 10 % of a trickle (under 5 m3/s) and a pool outside the forecast range', () => {
    const trickle = { ...last, inflowNow: 20 };
    expect(materialChange(trickle, { ...quiet, inflow: 24 })).toBeNull();
    expect(
      materialChange(last, { ...quiet, pool: { elevation: 300, tMs: 999_999_999 } }),
    ).toBeNull();
  });
});
