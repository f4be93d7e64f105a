import { findHighPoolSpells } from './high-pool';

describe('findHighPoolSpells', () => {
  it('joins samples closer than the gap and keeps each spell peak', () => {
    const H = 3_600_000;
    const spells = findHighPoolSpells(
      [
        { t: 0, v: 205.6 },
        { t: 0.5 * H, v: 206.4 },
        { t: 1.2 * H, v: 205.9 },
        { t: 5 * H, v: 205.7 },
      ],
      { mergeGapMs: H },
    );
    expect(spells).toEqual([
      { fromMs: 0, toMs: 1.2 * H, peak: { value: 206.4, timeMs: 0.5 * H } },
      { fromMs: 5 * H, toMs: 5 * H, peak: { value: 205.7, timeMs: 5 * H } },
    ]);
    expect(findHighPoolSpells([], { mergeGapMs: H })).toEqual([]);
  });
});
