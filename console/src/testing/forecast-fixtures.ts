import {
  FORECAST_CAUTION,
  type ForecastRun,
  type ForecastUpdate,
} from '@stillwell/shared/forecasts';
import { definition, SITE_NOW } from './fixtures';

const H = 3600_000;

/**
 * A forecast run of the demo reservoir made at SITE_NOW: the pool rising from 207 m by 0.1 m an
 * hour for 24 h at 5-minute points, the band widening to ±0.5 m, time left 2.5 h.
 */
export function makeRun(overrides: Partial<ForecastRun> = {}): ForecastRun {
  const n = 289;
  const at = (i: number) => 207 + (0.1 * i) / 12;
  const spread = (i: number) => (0.5 * i) / (n - 1);
  return {
    id: 7,
    reservoirId: definition.id,
    computedAtMs: SITE_NOW,
    trigger: 'schedule',
    triggerDetail: 'every 60 s of site time',
    definitionVersion: 3,
    codeVersion: { gateway: '0.1.0', options: '0123456789abcdef' },
    inputs: {
      siteNowMs: SITE_NOW,
      startElevation: 207,
      poolSource: 'pool.radar',
      openings: { 'gate-1': 0, 'gate-2': 0, 'gate-3': 0, 'low-level-outlet': 10 },
      assumedClosed: [],
      tailwater: null,
      inflow: {
        method: 'linear-trend',
        reason: 'rising: 150.0 m3/s per hour over the last 3 h',
        nowFlow: 850,
        parameters: {},
        notes: [],
        observedPoints: 720,
        observedFromMs: SITE_NOW - 12 * H,
      },
      horizonS: 86_400,
      dtS: 60,
      ensemble: {
        members: 200,
        seed: 'x',
        dtS: 300,
        sigma: 0.3,
        growthS: 43_200,
        correlationS: 21_600,
        intervalS: 900,
      },
    },
    series: {
      startMs: SITE_NOW,
      stepS: 300,
      inflow: Array.from({ length: n }, () => 850),
      elevation: Array.from({ length: n }, (_, i) => at(i)),
      outflow: Array.from({ length: n }, () => 420),
      p10: Array.from({ length: n }, (_, i) => at(i) - spread(i)),
      p50: Array.from({ length: n }, (_, i) => at(i)),
      p90: Array.from({ length: n }, (_, i) => at(i) + spread(i)),
    },
    peak: {
      elevation: 209.4,
      timeMs: SITE_NOW + 24 * H,
      outflow: 1500,
      outflowTimeMs: SITE_NOW + 24 * H,
      leftTableAtMs: null,
      p10: 208.9,
      p50: 209.4,
      p90: 209.9,
      membersAboveTable: 0,
    },
    thresholds: [
      {
        id: 'watch',
        label: 'Watch level',
        kind: 'alert',
        elevation: 205.5,
        timeMs: SITE_NOW,
        leadS: 0,
        alreadyAbove: true,
        timeAboveS: 86_400,
        probability: 1,
      },
      {
        id: 'normal-max',
        label: 'Normal maximum pool',
        kind: 'alert',
        elevation: 207,
        timeMs: SITE_NOW,
        leadS: 0,
        alreadyAbove: true,
        timeAboveS: 86_400,
        probability: 1,
      },
      {
        id: 'aux-spillway',
        label: 'Auxiliary spillway crest',
        kind: 'auxiliary-spillway',
        elevation: 209,
        timeMs: SITE_NOW + 20 * H,
        leadS: 72_000,
        alreadyAbove: false,
        timeAboveS: 14_400,
        probability: 0.8,
      },
      {
        id: 'freeboard-limit',
        label: 'Dam crest less freeboard',
        kind: 'crest-less-freeboard',
        elevation: 210.5,
        timeMs: null,
        leadS: null,
        alreadyAbove: false,
        timeAboveS: 0,
        probability: 0.1,
      },
    ],
    timeLeft: {
      status: 'ok',
      target: 210.5,
      targetLabel: 'Dam crest less freeboard',
      plan: {
        label: 'open all 3 spillway gates fully (9.00 m)',
        gates: ['gate-1', 'gate-2', 'gate-3'],
        opening: 9,
      },
      latestStartMs: SITE_NOW + 2.5 * H,
      timeLeftS: 9000,
      peakAtLatest: 210.4,
      peakIfStartedNow: 208,
      peakWithoutPlan: 211,
      message:
        'open all 3 spillway gates fully (9.00 m) by 3 Mar, 16:30 GMT (2 h 30 min from now) to keep the peak at or below Dam crest less freeboard (210.50 m)',
    },
    holdNow: {
      status: 'ok',
      target: 210.5,
      gates: ['gate-1', 'gate-2', 'gate-3'],
      opening: 3.6,
      maxOpening: 9,
      peakElevation: 210.5,
      peakTimeMs: SITE_NOW + 20 * H,
      message:
        'opening every spillway gate to 3.60 m now keeps the peak at 210.50 m, within Dam crest less freeboard',
    },
    notes: [],
    durationMs: 40,
    caution: FORECAST_CAUTION,
    ...overrides,
  };
}

export function makeUpdate(
  run: ForecastRun | null = makeRun(),
  problem: string | null = null,
): ForecastUpdate {
  return { reservoirId: definition.id, run, problem, caution: FORECAST_CAUTION };
}
