import { describe, expect, it } from 'vitest';
import { alarmPerformance, type Annunciation } from './performance.js';

const T0 = Date.UTC(2026, 2, 3, 0, 0, 0);
const MIN = 60_000;
const at = (
  minutes: number,
  conditionId = 'pool-high.watch',
  priority: Annunciation['priority'] = 'advisory',
) => ({
  conditionId,
  timeMs: T0 + minutes * MIN,
  priority,
});

// Benchmarks: ISA-18.2 / EEMUA 191: about 1 alarm per 10 minutes per operator acceptable,
// 10 or more in 10 minutes a flood; chattering alarms should not exist.
describe('alarm performance', () => {
  it('counts the average and peak per 10 minutes and judges them against the benchmarks', () => {
    const events = [0, 25, 50, 75, 100, 125].map((m, i) => at(m, `c${i}`));
    const r = alarmPerformance(events, T0, T0 + 130 * MIN);
    expect(r.total).toBe(6);
    expect(r.averagePer10Min).toBeCloseTo(6 / 13, 9);
    expect(r.peakPer10Min).toBe(1);
    expect(r.verdict).toEqual({ rate: 'acceptable', floods: false, chattering: false });
    expect(r.periods.length).toBe(13);
  });

  it('finds a flood of 10 in 10 minutes even across two fixed periods', () => {
    // minutes 5 to 14: ten alarms, split 5 + 5 over the fixed periods [0,10) and [10,20)
    const events = Array.from({ length: 10 }, (_, i) =>
      at(5 + i, `c${i}`, i < 2 ? 'immediate' : 'prompt'),
    );
    const r = alarmPerformance(events, T0, T0 + 60 * MIN);
    expect(r.periods.slice(0, 2)).toEqual([5, 5]);
    expect(r.floodPeriods).toBe(0);
    expect(r.peakPer10Min).toBe(10);
    expect(r.peakStartMs).toBe(T0 + 5 * MIN);
    expect(r.verdict.floods).toBe(true);
    expect(r.byPriority).toEqual({ immediate: 2, prompt: 8, advisory: 0 });
  });

  it('names the most frequent alarms and the chattering ones', () => {
    const events = [
      at(0, 'a'),
      at(0.2, 'a'),
      at(0.4, 'a'),
      at(30, 'a'),
      at(31, 'b'),
      at(45, 'b'),
      at(50, 'c'),
    ];
    const r = alarmPerformance(events, T0, T0 + 60 * MIN);
    expect(r.mostFrequent.map((x) => [x.conditionId, x.count])).toEqual([
      ['a', 4],
      ['b', 2],
      ['c', 1],
    ]);
    expect(r.chattering).toEqual([{ conditionId: 'a', bursts: 1, mostInAMinute: 3 }]);
    expect(r.verdict.chattering).toBe(true);
  });

  it('divides by the operators on shift', () => {
    const events = Array.from({ length: 12 }, (_, i) => at(i * 0.5, `c${i}`));
    expect(alarmPerformance(events, T0, T0 + 10 * MIN, 2).peakPer10Min).toBe(6);
  });
});
