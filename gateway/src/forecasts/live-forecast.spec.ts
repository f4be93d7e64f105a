import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { forecastRunSchema } from '@stillwell/shared/forecasts';
import { DEFAULT_FORECAST_SETTINGS } from './forecast-settings';
import { computeForecast, ForecastInputError, type ForecastState } from './live-forecast';

const H = 3600;
const NOW_S = 1_800_000_000; // a fixed site time
const options = {
  ...DEFAULT_FORECAST_SETTINGS.options,
  ensemble: { ...DEFAULT_FORECAST_SETTINGS.options.ensemble, members: 50 },
};

/** Observed inflow every minute over the last 12 h: rising at `perHour` m3/s per hour to `now`. */
function rising(now: number, perHour: number) {
  return Array.from({ length: 12 * 60 + 1 }, (_, i) => {
    const t = NOW_S - 12 * H + i * 60;
    return { t, q: Math.max(30, now - ((NOW_S - t) / H) * perHour) };
  });
}

function state(over: Partial<ForecastState> = {}): ForecastState {
  return {
    nowMs: NOW_S * 1000,
    pool: { elevation: 206, source: 'pool.radar' },
    openings: {
      gates: { 'gate-1': 0, 'gate-2': 0, 'gate-3': 0 },
      valves: { 'low-level-outlet': 10 },
    },
    assumedClosed: [],
    tailwater: null,
    observedInflow: rising(900, 150),
    lookback: null,
    notes: [],
    ...over,
  };
}

describe('computeForecast', () => {
  it('forecasts a rising pool on a rising flood with the gates shut, with a band and decisions', () => {
    const f = computeForecast(DEMO_RESERVOIR, state(), options, 'test');
    expect(f.inputs.inflow.method).toBe('linear-trend');
    expect(f.peak.elevation).toBeGreaterThan(206.5);
    const n = options.horizonS / options.outputStepS + 1;
    for (const key of ['inflow', 'elevation', 'outflow', 'p10', 'p50', 'p90'] as const)
      expect(f.series[key]).toHaveLength(n);
    // the band widens from nothing at the start (the present is observed)
    expect(f.series.p90[0]).toBeCloseTo(f.series.p10[0]!, 6);
    expect(f.series.p90[n - 1]!).toBeGreaterThan(f.series.p10[n - 1]!);
    expect(f.thresholds.map((t) => t.id)).toContain('crest-main-spillway');
    expect(f.timeLeft.target).toBe(210.5);
    expect(['ok', 'impossible']).toContain(f.timeLeft.status);
    expect(f.holdNow.status).toBe('ok');
    // the stored shape is the API's shape
    const run = {
      id: 1,
      reservoirId: 'lake-orrin',
      computedAtMs: NOW_S * 1000,
      trigger: 'schedule',
      triggerDetail: 'x',
      definitionVersion: 1,
      codeVersion: { gateway: '0', options: 'x' },
      durationMs: 1,
      caution: 'c',
      ...f,
    };
    expect(forecastRunSchema.safeParse(run).error).toBeUndefined();
  });

  it('gives a lower peak with the gates open than shut', () => {
    const shut = computeForecast(DEMO_RESERVOIR, state(), options, 'test');
    const open = computeForecast(
      DEMO_RESERVOIR,
      state({ openings: { gates: { 'gate-1': 6, 'gate-2': 6, 'gate-3': 6 }, valves: {} } }),
      options,
      'test',
    );
    expect(open.peak.elevation).toBeLessThan(shut.peak.elevation - 0.5);
  });

  it('says how long is left while there is time, and that it is too late once the chance has passed', () => {
    const flood = state({
      observedInflow: rising(2000, 0),
      pool: { elevation: 210.3, source: 'pool.radar' },
    });
    const late = computeForecast(DEMO_RESERVOIR, flood, options, 'test');
    expect(late.timeLeft.status).toBe('impossible');
    const withHistory = computeForecast(
      DEMO_RESERVOIR,
      {
        ...flood,
        lookback: { atMs: (NOW_S - 6 * H) * 1000, elevation: 205, openings: flood.openings },
      },
      options,
      'test',
    );
    expect(withHistory.timeLeft.status).toBe('past');
    expect(withHistory.timeLeft.timeLeftS).toBeLessThan(0);
    expect(withHistory.timeLeft.message).toContain('too late');

    const early = computeForecast(
      DEMO_RESERVOIR,
      state({ observedInflow: rising(600, 150) }),
      options,
      'test',
    );
    expect(early.timeLeft.status).toBe('ok');
    expect(early.timeLeft.timeLeftS).toBeGreaterThan(0);
    expect(early.timeLeft.message).toMatch(/by .* from now/);

    const calm = computeForecast(
      DEMO_RESERVOIR,
      state({
        observedInflow: [
          { t: NOW_S - 600, q: 30 },
          { t: NOW_S, q: 30 },
        ],
      }),
      options,
      'test',
    );
    expect(calm.inputs.inflow.method).toBe('persistence');
    expect(calm.timeLeft.status).toBe('not-needed');
    expect(calm.holdNow.status).toBe('not-needed');
  });

  it('is reproducible from its seed', () => {
    const a = computeForecast(DEMO_RESERVOIR, state(), options, 'seed-1');
    const b = computeForecast(DEMO_RESERVOIR, state(), options, 'seed-1');
    expect(b.series).toEqual(a.series);
  });

  it('refuses a pool outside the storage table and a missing inflow record, saying why', () => {
    expect(() =>
      computeForecast(
        DEMO_RESERVOIR,
        state({ pool: { elevation: 230, source: 'pool.radar' } }),
        options,
        's',
      ),
    ).toThrow(
      new ForecastInputError(
        'the pool reading 230.00 m is outside the storage table (171 to 217 m)',
      ),
    );
    expect(() =>
      computeForecast(DEMO_RESERVOIR, state({ observedInflow: [] }), options, 's'),
    ).toThrow(/no inflow forecast/);
  });
});
