import { describeRuns, judgeGap, nextPart, unavailableCount } from './gap-outcome';

describe('gap outcome', () => {
  it('asks for a long gap in bounded parts', () => {
    expect(nextPart(10, 2000, 500)).toEqual({ fromSeq: 10, toSeq: 509 });
    expect(nextPart(1510, 2000, 500)).toEqual({ fromSeq: 1510, toSeq: 2000 });
  });

  it('counts the unavailable sequence numbers inside the gap once', () => {
    const runs = [
      { fromSeq: 0, toSeq: 14, reason: 'overrun' as const },
      { fromSeq: 12, toSeq: 20, reason: 'not-held' as const },
    ];
    expect(unavailableCount(runs, 10, 30)).toBe(11);
    expect(describeRuns([{ fromSeq: 7, toSeq: 7, reason: 'not-held' }])).toBe('not-held 7');
  });

  it('is filled when all is stored, unavailable when the device explains the rest', () => {
    const gap = { fromSeq: 10, toSeq: 19 };
    expect(judgeGap(gap, 10, [], false)).toEqual({ state: 'filled', detail: null });
    expect(judgeGap(gap, 7, [{ fromSeq: 10, toSeq: 12, reason: 'overrun' }], false)).toEqual({
      state: 'unavailable',
      detail: '3 of 10 gone: overrun 10-12',
    });
  });

  it('waits while readings may still come, and gives up only at the last attempt', () => {
    const gap = { fromSeq: 10, toSeq: 19 };
    expect(judgeGap(gap, 5, [], false)).toBeNull();
    expect(judgeGap(gap, 5, [{ fromSeq: 10, toSeq: 11, reason: 'overrun' }], false)).toBeNull();
    expect(judgeGap(gap, 5, [], true)).toEqual({
      state: 'unanswered',
      detail: '5 of 10 still missing',
    });
  });
});
