import { describe, expect, it } from 'vitest';
import { alarmsAt } from './alarm-fold.js';

const ev = (
  kind: 'raised' | 'cleared' | 'acknowledged' | 'shelved' | 'returned-to-service',
  t: number,
  id = 'pool.watch',
) => ({
  conditionId: id,
  kind,
  siteTimeMs: t,
  priority: 'advisory' as const,
  text: `${kind} at ${t}`,
  actor: kind === 'acknowledged' ? 'operator' : null,
});

describe('alarmsAt', () => {
  const events = [ev('raised', 10), ev('acknowledged', 20), ev('cleared', 30), ev('raised', 40)];

  it('folds the events up to the moment, in order', () => {
    expect(alarmsAt([], events, 5)).toEqual([]);
    expect(alarmsAt([], events, 10).map((a) => a.state)).toEqual(['unacknowledged']);
    expect(alarmsAt([], events, 25)[0]).toMatchObject({
      state: 'acknowledged',
      actor: 'operator',
      sinceMs: 20,
    });
    // cleared after acknowledgement: back to normal, so no longer standing
    expect(alarmsAt([], events, 35)).toEqual([]);
    expect(alarmsAt([], events, 40).map((a) => a.state)).toEqual(['unacknowledged']);
  });

  it('starts from the states standing when the window opened', () => {
    const start = alarmsAt([], [ev('raised', 1, 'stale.rain')], 1);
    const at = alarmsAt(start, [ev('shelved', 50, 'stale.rain')], 60);
    expect(at).toHaveLength(1);
    expect(at[0]).toMatchObject({ conditionId: 'stale.rain', state: 'shelved' });
    const back = alarmsAt(at, [ev('returned-to-service', 70, 'stale.rain')], 80);
    expect(back[0]!.state).toBe('unacknowledged');
  });
});
