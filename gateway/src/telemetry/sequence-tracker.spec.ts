import { SequenceTracker } from './sequence-tracker';

describe('SequenceTracker', () => {
  it('accepts consecutive numbers and reports a jump as the missing range', () => {
    const t = new SequenceTracker();
    expect(t.observe('d', 0, 1000)).toEqual({ kind: 'next' });
    expect(t.observe('d', 1, 2000)).toEqual({ kind: 'next' });
    expect(t.observe('d', 5, 6000)).toEqual({ kind: 'gap', fromSeq: 2, toSeq: 4 });
    expect(t.observe('d', 6, 7000)).toEqual({ kind: 'next' });
  });
  it('tells a repeated or late delivery from a device restart', () => {
    const t = new SequenceTracker();
    t.seed('d', 10, 10_000);
    expect(t.observe('d', 10, 10_000)).toEqual({ kind: 'late' });
    expect(t.observe('d', 7, 7_000)).toEqual({ kind: 'late' });
    expect(t.observe('d', 0, 20_000)).toEqual({ kind: 'restart' });
    expect(t.observe('d', 1, 21_000)).toEqual({ kind: 'next' });
  });
  it('keeps devices apart', () => {
    const t = new SequenceTracker();
    t.observe('a', 0, 1);
    expect(t.observe('b', 3, 1)).toEqual({ kind: 'next' });
    expect(t.observe('a', 2, 2)).toEqual({ kind: 'gap', fromSeq: 1, toSeq: 1 });
  });
});
