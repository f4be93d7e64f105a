import { describe, expect, it } from 'vitest';
import { advance, lastAtOrBefore, valueAt } from './playback';

describe('advance', () => {
  it('moves the cursor by wall time times speed, and stops at the end', () => {
    const p = { cursorMs: 1000, playing: true, speed: 360 as const };
    expect(advance(p, 100, 1e9)).toEqual({ ...p, cursorMs: 1000 + 36_000 });
    expect(advance(p, 100, 20_000)).toEqual({ ...p, cursorMs: 20_000, playing: false });
    expect(advance({ ...p, playing: false }, 100, 1e9).cursorMs).toBe(1000);
  });
});

describe('lastAtOrBefore and valueAt', () => {
  const t = [10, 20, 20, 30];
  it('finds the last item not after the moment', () => {
    expect(lastAtOrBefore(t, 5, (x) => x)).toBe(-1);
    expect(lastAtOrBefore(t, 20, (x) => x)).toBe(2);
    expect(lastAtOrBefore(t, 29, (x) => x)).toBe(2);
    expect(lastAtOrBefore(t, 99, (x) => x)).toBe(3);
  });
  it('reads the value shown at the moment', () => {
    expect(valueAt(t, [1, 2, 3, 4], 25)).toBe(3);
    expect(valueAt(t, [1, 2, 3, 4], 1)).toBeNull();
  });
});
