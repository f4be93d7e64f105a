import { describe, expect, it } from 'vitest';
import type { LogbookEntry } from '@stillwell/shared/logbook';
import { filterQuery, matchesFilter, NO_FILTER, summaryOf } from './filters';

const entry = (over: Partial<LogbookEntry> = {}): LogbookEntry => ({
  seq: 7,
  time: '2026-03-03T14:00:00.000Z',
  actorId: 'u1',
  actorName: 'operator',
  actorRoles: ['operator'],
  kind: 'order.executed',
  payload: { orderId: 12, controls: ['gate-2'] },
  prevHash: '0'.repeat(64),
  hash: '1'.repeat(64),
  ...over,
});

describe('logbook filters', () => {
  it('send only what is set', () => {
    expect(filterQuery({ ...NO_FILTER, kind: 'order.', gate: 'gate-2' })).toEqual({
      kind: 'order.',
      gate: 'gate-2',
    });
  });

  it('place a pushed entry as the gateway would', () => {
    expect(matchesFilter(entry(), NO_FILTER)).toBe(true);
    expect(matchesFilter(entry(), { ...NO_FILTER, kind: 'order.' })).toBe(true);
    expect(matchesFilter(entry(), { ...NO_FILTER, kind: 'order.' + 'drafted' })).toBe(false);
    expect(matchesFilter(entry(), { ...NO_FILTER, gate: 'gate-1' })).toBe(false);
    expect(matchesFilter(entry(), { ...NO_FILTER, actor: 'engineer' })).toBe(false);
    expect(matchesFilter(entry(), { ...NO_FILTER, to: '2026-03-03T13:59:00.000Z' })).toBe(false);
  });

  it('sum an entry up in its own words', () => {
    expect(
      summaryOf(
        entry({
          kind: 'shift.handover',
          payload: { from: 'operator', to: 'Jory', text: 'pool rising' },
        }),
      ),
    ).toBe('operator to Jory: pool rising');
    expect(summaryOf(entry({ payload: { orderId: 3, comment: 'agreed' } }))).toBe(
      'order 3 · agreed',
    );
  });
});
