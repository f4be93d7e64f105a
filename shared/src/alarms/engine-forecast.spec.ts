import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR } from '../reservoirs/index.js';
import type { ForecastOutlook } from './engine-state.js';
import { AlarmEngine } from './engine.js';

const T0 = Date.UTC(2026, 2, 3, 0, 0, 0);
const H = 3_600_000;

/** A forecast run at `at` whose deterministic peak is `peak`, reaching each level `leadH` ahead. */
function outlook(
  at: number,
  peak: number,
  leads: Record<string, number | null>,
  timeLeft: ForecastOutlook['timeLeft'] = { status: 'not-needed', timeLeftS: null },
): ForecastOutlook {
  return {
    computedAtMs: at,
    peak: { elevation: peak },
    thresholds: DEMO_RESERVOIR.thresholds.map((t) => ({
      id: t.id,
      elevation: t.elevation,
      timeMs: leads[t.id] === undefined || leads[t.id] === null ? null : at + leads[t.id]! * H,
      alreadyAbove: false,
    })),
    timeLeft,
  };
}

function judge(engine: AlarmEngine, at: number, o: ForecastOutlook | null) {
  engine.acceptForecast(o);
  return engine
    .evaluate(at)
    .filter((c) => c.conditionId.startsWith('forecast') || c.conditionId === 'time-left')
    .map((c) => `${c.change} ${c.conditionId}`);
}

describe('forecast conditions', () => {
  it('raise for a crossing within the 12 h horizon, not for one beyond it, and clear when the peak drops', () => {
    const e = new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 });
    expect(judge(e, T0, outlook(T0, 209.5, { 'aux-spillway': 14 }))).toEqual([]);
    expect(judge(e, T0 + H, outlook(T0 + H, 209.6, { 'aux-spillway': 11.5 }))).toEqual([
      'raise forecast-crossing.aux-spillway',
    ]);
    // the peak hovering at the level from run to run does not chatter
    expect(judge(e, T0 + 2 * H, outlook(T0 + 2 * H, 208.98, { 'aux-spillway': null }))).toEqual([]);
    expect(judge(e, T0 + 3 * H, outlook(T0 + 3 * H, 209.01, { 'aux-spillway': 9 }))).toEqual([]);
    // clears once the forecasts have said so for the 30-minute off-delay
    expect(judge(e, T0 + 4 * H, outlook(T0 + 4 * H, 208.9, { 'aux-spillway': null }))).toEqual([]);
    expect(judge(e, T0 + 4.5 * H, outlook(T0 + 4.5 * H, 208.8, { 'aux-spillway': null }))).toEqual([
      'clear forecast-crossing.aux-spillway',
    ]);
  });

  it('only the levels the limits name are forecast alarms', () => {
    const e = new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 });
    expect(judge(e, T0, outlook(T0, 207.5, { watch: 1, 'normal-max': 2 }))).toEqual([]);
    expect(e.conditions.filter((c) => c.kind === 'forecast-crossing').map((c) => c.id)).toEqual([
      'forecast-crossing.aux-spillway',
      'forecast-crossing.freeboard-limit',
    ]);
  });

  it('time left to act: raises under the 3 h margin, holds within the deadband, clears above it', () => {
    const e = new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 });
    const ok = (s: number): ForecastOutlook['timeLeft'] => ({ status: 'ok', timeLeftS: s });
    expect(judge(e, T0, outlook(T0, 210, {}, ok(4 * 3600)))).toEqual([]);
    expect(judge(e, T0 + H, outlook(T0 + H, 210, {}, ok(2.9 * 3600)))).toEqual(['raise time-left']);
    expect(judge(e, T0 + 2 * H, outlook(T0 + 2 * H, 210, {}, ok(3.2 * 3600)))).toEqual([]);
    // above the margin plus the deadband, for the 30-minute off-delay
    expect(judge(e, T0 + 3 * H, outlook(T0 + 3 * H, 210, {}, ok(3.3 * 3600)))).toEqual([]);
    expect(judge(e, T0 + 3.5 * H, outlook(T0 + 3.5 * H, 210, {}, ok(3.4 * 3600)))).toEqual([
      'clear time-left',
    ]);
    expect(
      judge(e, T0 + 4 * H, outlook(T0 + 4 * H, 211, {}, { status: 'past', timeLeftS: -1800 })),
    ).toEqual(['raise time-left']);
  });

  it('does not chatter when runs minutes apart flip between "impossible" and "not needed"', () => {
    // the pool sitting at the target on the recession: each run says the other thing
    const e = new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 });
    const said: string[] = [];
    for (let k = 0; k < 12; k++) {
      const at = T0 + k * 120_000;
      const status = k % 2 === 0 ? 'impossible' : 'not-needed';
      said.push(...judge(e, at, outlook(at, 210.5, {}, { status, timeLeftS: null })));
    }
    expect(said).toEqual(['raise time-left']);
  });

  it('holds its alarms when the forecast is missing or older than 2 h, rather than clearing them', () => {
    const e = new AlarmEngine(DEMO_RESERVOIR, { startMs: T0 });
    expect(judge(e, T0, outlook(T0, 211, {}, { status: 'impossible', timeLeftS: null }))).toEqual([
      'raise time-left',
    ]);
    expect(
      judge(e, T0 + 3 * H, outlook(T0, 211, {}, { status: 'not-needed', timeLeftS: null })),
    ).toEqual([]);
    expect(judge(e, T0 + 3 * H, null)).toEqual([]);
    expect(e.isActive('time-left')).toBe(true);
  });
});
