import { describe, expect, it } from 'vitest';
import { isAffected, travelTimeFor } from './travel-time.js';
import { travelTimeTableSchema } from './zones.js';

const table = [
  { releaseM3s: 100, travelTimeS: 3000 },
  { releaseM3s: 500, travelTimeS: 1500 },
  { releaseM3s: 1500, travelTimeS: 900 },
];

describe('travel time from the engineer table', () => {
  it('takes a row as it is and interpolates linearly between rows', () => {
    expect(travelTimeFor(table, 500)).toEqual({ travelTimeS: 1500, beyondTable: null });
    expect(travelTimeFor(table, 300)).toEqual({ travelTimeS: 2250, beyondTable: null });
    expect(travelTimeFor(table, 1000)).toEqual({ travelTimeS: 1200, beyondTable: null });
  });

  it('uses the nearest row outside the table and says which side', () => {
    expect(travelTimeFor(table, 50)).toEqual({ travelTimeS: 3000, beyondTable: 'below' });
    expect(travelTimeFor(table, 4000)).toEqual({ travelTimeS: 900, beyondTable: 'above' });
    expect(travelTimeFor([{ releaseM3s: 200, travelTimeS: 600 }], 200).travelTimeS).toBe(600);
  });

  it('refuses a table whose releases do not ascend, naming the row', () => {
    const bad = travelTimeTableSchema.safeParse([table[0], table[2], table[1]]);
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0]).toMatchObject({ path: [2, 'releaseM3s'] });
    expect(bad.error?.issues[0]?.message).toMatch(/greater than the row above \(1500 m3\/s\)/);
  });

  it('affects a zone only when the order reaches its threshold and raises the flow', () => {
    const zone = { affectedAtM3s: 400 };
    expect(isAffected(zone, 399, 0)).toBe(false);
    expect(isAffected(zone, 400, 0)).toBe(true);
    expect(isAffected(zone, 600, 700)).toBe(false);
    expect(isAffected(zone, 800, 700)).toBe(true);
    expect(isAffected(zone, 800, null)).toBe(true);
  });
});
