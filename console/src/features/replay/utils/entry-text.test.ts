import { describe, expect, it } from 'vitest';
import type { AlarmEvent } from '@stillwell/shared/alarms';
import type { ReplayEntry } from '@stillwell/shared/replay';
import { entryText, timeline } from './entry-text';

const entry = (seq: number, siteTimeMs: number, payload: Record<string, unknown>): ReplayEntry => ({
  seq,
  siteTimeMs,
  timeSource: 'recorded',
  time: new Date(0).toISOString(),
  kind: 'shift.note',
  actorName: 'operator',
  payload,
});

const alarm = (id: number, siteTimeMs: number, logbookSeq: number | null): AlarmEvent => ({
  id,
  reservoirId: 'lake-orrin',
  conditionId: 'pool.watch',
  kind: logbookSeq ? 'acknowledged' : 'raised',
  siteTimeMs,
  priority: 'advisory',
  annunciated: true,
  actor: null,
  text: 'Pool above the watch level',
  value: 205.6,
  logbookSeq,
});

describe('entryText', () => {
  it('takes the first of text, comment, reason ... and falls back to what it is about', () => {
    expect(entryText({ comment: ' checked ', label: 'x' })).toBe('checked');
    expect(entryText({ orderId: 17 })).toBe('17');
    expect(entryText({})).toBe('');
  });
});

describe('timeline', () => {
  it('merges entries and system alarm events in time order, without people’s actions twice', () => {
    const items = timeline(
      [entry(1, 300, { text: 'late note' }), entry(2, 100, { text: 'early note' })],
      [alarm(7, 200, null), alarm(8, 250, 5)],
    );
    expect(items.map((i) => i.key)).toEqual(['entry-2', 'alarm-7', 'entry-1']);
    expect(items[1]!.text).toBe('pool.watch: Pool above the watch level');
  });
});
