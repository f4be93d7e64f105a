import { describe, expect, it } from 'vitest';
import { makeReading, makeSeries } from '../../../testing/fixtures';
import { appendReadings } from './append-readings';

const HOUR = 3_600_000;

describe('appendReadings', () => {
  const series = makeSeries('pool.radar', [
    [1_000, 207.0],
    [2_000, 207.1],
  ]);

  it('appends newer readings of its own channel only', () => {
    const next = appendReadings(
      series,
      [makeReading('pool.radar', 3_000, 207.2), makeReading('inflow', 3_000, 900)],
      HOUR,
    );
    expect(next.t).toEqual([1_000, 2_000, 3_000]);
    expect(next.v).toEqual([207.0, 207.1, 207.2]);
    expect(next.q).toEqual(['good', 'good', 'good']);
  });

  it('returns the same series when the batch has nothing for it', () => {
    expect(appendReadings(series, [makeReading('inflow', 3_000, 900)], HOUR)).toBe(series);
  });

  it('merges a late reading into place and replaces one at a time it already holds', () => {
    const next = appendReadings(
      series,
      [makeReading('pool.radar', 1_500, 207.05), makeReading('pool.radar', 2_000, 150, 'bad')],
      HOUR,
    );
    expect(next.t).toEqual([1_000, 1_500, 2_000]);
    expect(next.v).toEqual([207.0, 207.05, 150]);
    expect(next.q).toEqual(['good', 'good', 'bad']);
  });

  it('drops what falls out of the window before the newest point', () => {
    const next = appendReadings(series, [makeReading('pool.radar', HOUR + 1_500, 207.3)], HOUR);
    expect(next.t).toEqual([2_000, HOUR + 1_500]);
    expect(next.v).toEqual([207.1, 207.3]);
  });

  it('does not change the cached series it was given', () => {
    appendReadings(series, [makeReading('pool.radar', 3_000, 207.2)], HOUR);
    expect(series.t).toEqual([1_000, 2_000]);
  });
});
