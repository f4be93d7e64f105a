import { describe, expect, it } from 'vitest';
import { assessClearance, type ZoneClearanceInput } from './clearance.js';

const T0 = Date.parse('2026-12-01T10:00:00Z');
const order = { orderId: 'ord-1', emergency: false };
const sentZone = (deliveredAt: number | null, leadTimeS = 3600): ZoneClearanceInput => ({
  zoneId: 'z-hessford',
  zoneName: 'Hessford',
  activeContacts: 2,
  notice: {
    state: 'sent',
    required: [
      { contactId: 'c-1', contactName: 'Dorran Pike', sentAt: deliveredAt, deliveredAt, leadTimeS },
    ],
  },
});

describe('downstream clearance', () => {
  it('is clear with no affected zone at all', () => {
    expect(assessClearance(order, [], T0)).toMatchObject({
      clear: true,
      shortfalls: [],
      clearAt: T0,
      summary: expect.stringMatching(/^No downstream zone is affected/),
    });
  });

  it('refuses until the lead time has run on the site clock, then clears', () => {
    const zones = [sentZone(T0)];
    const during = assessClearance(order, zones, T0 + 3599_000);
    expect(during.clear).toBe(false);
    expect(during.shortfalls).toEqual([
      expect.objectContaining({
        reason: 'lead-time-running',
        contactName: 'Dorran Pike',
        readyAt: T0 + 3600_000,
      }),
    ]);
    expect(during.clearAt).toBe(T0 + 3600_000);
    expect(during.summary).toMatch(
      /^Not clear downstream: Dorran Pike \(Hessford\) is still within its lead time/,
    );
    expect(assessClearance(order, zones, T0 + 3600_000)).toMatchObject({
      clear: true,
      shortfalls: [],
    });
  });

  it('names each way a zone can be short', () => {
    const zones: ZoneClearanceInput[] = [
      { zoneId: 'a', zoneName: 'A', activeContacts: 0, notice: null },
      { zoneId: 'b', zoneName: 'B', activeContacts: 1, notice: null },
      {
        zoneId: 'c',
        zoneName: 'C',
        activeContacts: 1,
        notice: { state: 'prepared', required: [] },
      },
      {
        zoneId: 'd',
        zoneName: 'D',
        activeContacts: 1,
        notice: { state: 'withdrawn', required: [] },
      },
      sentZone(null),
    ];
    const verdict = assessClearance(order, zones, T0);
    expect(verdict.shortfalls.map((s) => s.reason)).toEqual([
      'no-contacts',
      'not-prepared',
      'not-sent',
      'not-prepared',
      'not-delivered',
    ]);
    expect(verdict.clear).toBe(false);
    expect(verdict.clearAt).toBeNull();
  });

  it('lets a declared emergency through and still lists the shortfall', () => {
    const verdict = assessClearance(
      { orderId: 'ord-2', emergency: true },
      [sentZone(T0)],
      T0 + 60_000,
    );
    expect(verdict.clear).toBe(true);
    expect(verdict.emergency).toBe(true);
    expect(verdict.shortfalls).toHaveLength(1);
    expect(verdict.summary).toMatch(/^Declared emergency: downstream is not clear/);
  });
});
