import { floorMinute, foldMinutes, type RawReading } from './minute-aggregates';

const r = (time: number, value: number, quality = 'good'): RawReading => ({
  time,
  value,
  quality,
  received_at: time + 5,
});

describe('foldMinutes', () => {
  it('keeps each minute: min and max with their times, mean and counts', () => {
    const m0 = floorMinute(Date.UTC(2026, 11, 2, 3, 0, 30));
    const rows = [
      r(m0, 2),
      r(m0 + 10_000, 7),
      r(m0 + 20_000, -1),
      r(m0 + 30_000, 4, 'suspect'),
      r(m0 + 60_000, 5),
    ];
    const [a, b] = foldMinutes(rows);
    expect(a).toEqual({
      minute: m0,
      count: 4,
      min: -1,
      minTime: m0 + 20_000,
      max: 7,
      maxTime: m0 + 10_000,
      mean: 3,
      suspectCount: 1,
      badCount: 0,
      firstReceivedAt: m0 + 5,
    });
    expect(b).toMatchObject({ minute: m0 + 60_000, count: 1, min: 5, max: 5, mean: 5 });
  });

  it('counts bad readings without letting them be an extreme', () => {
    const [a] = foldMinutes([r(0, 1), r(1000, 999, 'bad'), r(2000, 3)]);
    expect(a).toMatchObject({ count: 2, badCount: 1, max: 3, mean: 2 });
    const [allBad] = foldMinutes([r(0, 9, 'bad')]);
    expect(allBad).toMatchObject({ count: 0, badCount: 1, min: null, max: null, mean: null });
  });
});
