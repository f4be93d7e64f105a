import { describe, expect, it } from 'vitest';
import {
  applyAction,
  applyCondition,
  displayState,
  expireShelf,
  NORMAL,
  type AlarmAction,
  type AlarmState,
} from './lifecycle.js';

// The ISA-18.2 (IEC 62682) alarm state model: normal, unacknowledged, acknowledged, returned to
// normal unacknowledged, shelved, out of service (latching and suppression by design aside).
const NOW = Date.UTC(2026, 2, 3, 14);
const ctx = { nowMs: NOW, shelveMaxMs: 12 * 3_600_000 };
const act = (s: AlarmState, a: AlarmAction) => applyAction(s, a, ctx);
const ok = (s: AlarmState, a: AlarmAction) => {
  const r = act(s, a);
  if (!r.ok) throw new Error(`refused: ${r.refusal}`);
  return r.state;
};
const raised = applyCondition(NORMAL, 'raise').state;

describe('alarm states after ISA-18.2', () => {
  it('normal -> unacknowledged on raise, annunciated', () => {
    const r = applyCondition(NORMAL, 'raise');
    expect(r.annunciated).toBe(true);
    expect(displayState(r.state)).toBe('unacknowledged');
  });

  it('unacknowledged -> acknowledged -> normal when the condition clears', () => {
    const acked = ok(raised, { type: 'acknowledge', comment: 'seen' });
    expect(displayState(acked)).toBe('acknowledged');
    expect(displayState(applyCondition(acked, 'clear').state)).toBe('normal');
  });

  it('unacknowledged -> cleared-unacknowledged on clear, and stays until acknowledged', () => {
    const cleared = applyCondition(raised, 'clear').state;
    expect(displayState(cleared)).toBe('cleared-unacknowledged');
    expect(displayState(ok(cleared, { type: 'acknowledge' }))).toBe('normal');
  });

  it('a raise while active is no new annunciation', () => {
    expect(applyCondition(raised, 'raise')).toEqual({ state: raised, annunciated: false });
  });

  it('refuses acknowledging twice, and acknowledging an alarm at rest', () => {
    const acked = ok(raised, { type: 'acknowledge' });
    expect(act(acked, { type: 'acknowledge' })).toMatchObject({
      ok: false,
      refusal: 'already-acknowledged',
    });
    expect(act(NORMAL, { type: 'acknowledge' })).toMatchObject({
      ok: false,
      refusal: 'already-acknowledged',
    });
  });

  it('shelves with a reason and an expiry in site time, silently follows the condition, and expires', () => {
    const shelved = ok(raised, {
      type: 'shelve',
      reason: 'gauge under repair',
      untilMs: NOW + 3_600_000,
    });
    expect(displayState(shelved)).toBe('shelved');
    expect(shelved.reason).toBe('gauge under repair');
    const cleared = applyCondition(shelved, 'clear');
    expect(cleared.annunciated).toBe(false);
    const again = applyCondition(cleared.state, 'raise');
    expect(again.annunciated).toBe(false);
    expect(expireShelf(again.state, NOW + 3_599_999)).toBeNull();
    // back in service while still active: presented afresh, unacknowledged
    const back = expireShelf(again.state, NOW + 3_600_000)!;
    expect(displayState(back)).toBe('unacknowledged');
    expect(back.reason).toBeNull();
  });

  it('a shelf expiring after the condition cleared returns the alarm to normal', () => {
    const shelved = ok(raised, {
      type: 'shelve',
      reason: 'chattering gauge',
      untilMs: NOW + 60_000,
    });
    const cleared = applyCondition(shelved, 'clear').state;
    expect(displayState(expireShelf(cleared, NOW + 60_000)!)).toBe('normal');
  });

  it('refuses shelving without a reason, into the past or beyond the maximum, or twice', () => {
    expect(act(raised, { type: 'shelve', reason: '', untilMs: NOW + 60_000 })).toMatchObject({
      refusal: 'reason-required',
    });
    expect(act(raised, { type: 'shelve', reason: '   x  ', untilMs: NOW + 60_000 })).toMatchObject({
      refusal: 'reason-required',
    });
    expect(act(raised, { type: 'shelve', reason: 'known fault', untilMs: NOW })).toMatchObject({
      refusal: 'expiry-not-in-future',
    });
    expect(
      act(raised, { type: 'shelve', reason: 'known fault', untilMs: NOW + 13 * 3_600_000 }),
    ).toMatchObject({ refusal: 'expiry-too-far' });
    const shelved = ok(raised, { type: 'shelve', reason: 'known fault', untilMs: NOW + 60_000 });
    expect(act(shelved, { type: 'shelve', reason: 'again', untilMs: NOW + 120_000 })).toMatchObject(
      { refusal: 'not-in-service' },
    );
    expect(act(shelved, { type: 'acknowledge' })).toMatchObject({ refusal: 'not-in-service' });
  });

  it('takes out of service with a reason (from service or a shelf) and returns to service', () => {
    expect(act(raised, { type: 'remove-from-service', reason: '' })).toMatchObject({
      refusal: 'reason-required',
    });
    const oos = ok(raised, { type: 'remove-from-service', reason: 'radar replaced this week' });
    expect(displayState(oos)).toBe('out-of-service');
    expect(expireShelf(oos, NOW + 10 ** 12)).toBeNull();
    expect(act(oos, { type: 'remove-from-service', reason: 'again and again' })).toMatchObject({
      refusal: 'not-in-service',
    });
    expect(displayState(ok(oos, { type: 'return-to-service' }))).toBe('unacknowledged');
    const shelved = ok(raised, { type: 'shelve', reason: 'known fault', untilMs: NOW + 60_000 });
    expect(
      displayState(ok(shelved, { type: 'remove-from-service', reason: 'sensor removed' })),
    ).toBe('out-of-service');
  });

  it('refuses returning an alarm to service that is in service', () => {
    expect(act(raised, { type: 'return-to-service' })).toMatchObject({
      ok: false,
      refusal: 'already-in-service',
    });
  });

  it('never changes the state it is given', () => {
    const before = JSON.stringify(raised);
    act(raised, { type: 'acknowledge' });
    act(raised, { type: 'shelve', reason: 'some reason', untilMs: NOW + 1000 });
    expect(JSON.stringify(raised)).toBe(before);
  });
});
