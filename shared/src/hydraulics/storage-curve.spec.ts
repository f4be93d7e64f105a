import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DEMO_RESERVOIR } from '../reservoirs/demo.js';
import { createStorageCurve } from './storage-curve.js';
import { StorageTableError, validateStorageTable } from './storage-validate.js';

const demo = DEMO_RESERVOIR.storageTable;
const top = demo[demo.length - 1]!;

describe('createStorageCurve on the demo table (Lake Orrin)', () => {
  const curve = createStorageCurve(demo);
  it('passes through every row and reports the range', () => {
    expect(curve.minElevation).toBe(171);
    expect(curve.maxElevation).toBe(top.elevation);
    for (const r of demo) {
      expect(curve.storageAt(r.elevation)).toBeCloseTo(r.storage, 3);
      expect(curve.elevationAt(r.storage)).toBeCloseTo(r.elevation, 9);
      expect(curve.areaAt(r.elevation)).toBeCloseTo(r.area, 3);
    }
    expect(curve.limitedRows).toBe(0);
  });
  it('matches the generating formula between rows (A = 3 km2 ((z-171)/36)^1.92, S its integral)', () => {
    // The formula is stated in demo.ts; its integral S = 3e6 * 36 / 2.92 * ((z-171)/36)^2.92.
    const s = (z: number) => ((3e6 * 36) / 2.92) * ((z - 171) / 36) ** 2.92;
    const a = (z: number) => 3e6 * ((z - 171) / 36) ** 1.92;
    for (const z of [185.5, 199.5, 204.5, 207.3, 210.75, top.elevation - 0.5]) {
      expect(Math.abs(curve.storageAt(z) - s(z)) / s(z)).toBeLessThan(2e-4);
      expect(Math.abs(curve.areaAt(z) - a(z)) / a(z)).toBeLessThan(5e-3);
    }
  });
  it('round-trips elevation -> storage -> elevation', () => {
    fc.assert(
      fc.property(fc.double({ min: 171, max: top.elevation, noNaN: true }), (z) => {
        expect(curve.elevationAt(curve.storageAt(z))).toBeCloseTo(z, 7);
      }),
    );
  });
  it('is strictly increasing both ways', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 171, max: top.elevation, noNaN: true }),
        fc.double({ min: 171, max: top.elevation, noNaN: true }),
        (a, b) => {
          fc.pre(a < b);
          expect(curve.storageAt(a)).toBeLessThanOrEqual(curve.storageAt(b));
          expect(curve.areaAt(a)).toBeGreaterThanOrEqual(0);
        },
      ),
    );
  });
  it('throws a RangeError naming the value and the range outside the table', () => {
    const above = top.elevation + 0.5;
    expect(() => curve.storageAt(above)).toThrow(RangeError);
    expect(() => curve.storageAt(above)).toThrow(
      `elevation ${above} m is outside the storage table (171 to ${top.elevation} m)`,
    );
    expect(() => curve.elevationAt(-1)).toThrow(
      `storage -1 m3 is outside the storage table (0 to ${top.storage} m3)`,
    );
    // the message format, on a fixed table
    const small = createStorageCurve([
      { elevation: 171, area: 0, storage: 0 },
      { elevation: 214, area: 4220000, storage: 62139000 },
    ]);
    expect(() => small.storageAt(214.5)).toThrow(
      'elevation 214.5 m is outside the storage table (171 to 214 m)',
    );
    expect(() => curve.areaAt(Number.NaN)).toThrow(RangeError);
  });
  it('clamps when asked', () => {
    const c = createStorageCurve(demo, { outOfRange: 'clamp' });
    expect(c.storageAt(top.elevation + 3)).toBe(top.storage);
    expect(c.elevationAt(1e12)).toBe(top.elevation);
    expect(c.storageAt(100)).toBe(0);
  });
});

describe('monotone interpolation on random tables', () => {
  const table = fc
    .array(
      fc.record({
        dh: fc.double({ min: 0.1, max: 5, noNaN: true }),
        da: fc.double({ min: 0, max: 1e6, noNaN: true }),
        ds: fc.double({ min: 0, max: 1e7, noNaN: true }),
      }),
      { minLength: 1, maxLength: 12 },
    )
    .map((steps) => {
      const rows = [{ elevation: 100, area: 0, storage: 0 }];
      for (const s of steps) {
        const p = rows[rows.length - 1]!;
        rows.push({
          elevation: p.elevation + s.dh,
          area: p.area + s.da,
          storage: p.storage + s.ds,
        });
      }
      return rows;
    });
  it('storage never decreases with elevation, even where area and storage disagree', () => {
    fc.assert(
      fc.property(
        table,
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (rows, u, v) => {
          const c = createStorageCurve(rows);
          const span = c.maxElevation - c.minElevation;
          const a = c.minElevation + Math.min(u, v) * span;
          const b = c.minElevation + Math.max(u, v) * span;
          expect(c.storageAt(a)).toBeLessThanOrEqual(c.storageAt(b) + 1e-6);
          expect(c.areaAt(a)).toBeGreaterThanOrEqual(-1e-9);
          const s = c.storageAt(b);
          expect(c.storageAt(c.elevationAt(s))).toBeCloseTo(s, 3);
        },
      ),
    );
  });
});

describe('validateStorageTable', () => {
  it('accepts the demo table with no problems', () => {
    expect(validateStorageTable(demo)).toEqual([]);
  });
  it('reports a non-increasing elevation with the row, field and previous value', () => {
    const rows = [
      { elevation: 198, area: 1, storage: 0 },
      { elevation: 199, area: 2, storage: 1.5 },
      { elevation: 200, area: 3, storage: 4 },
      { elevation: 200, area: 4, storage: 7.5 },
    ];
    const problems = validateStorageTable(rows);
    expect(problems).toContainEqual({
      row: 4,
      field: 'elevation',
      message: 'row 4 (elevation): must be above row 3 (200 m)',
      severity: 'error',
    });
    expect(() => createStorageCurve(rows)).toThrow(StorageTableError);
    expect(() => createStorageCurve(rows)).toThrow(
      'row 4 (elevation): must be above row 3 (200 m)',
    );
    try {
      createStorageCurve(rows);
    } catch (e) {
      expect((e as StorageTableError).problems).toHaveLength(1);
    }
  });
  it('reports decreasing storage and area, negatives, non-finite values, ranges and short tables', () => {
    const messages = (rows: Parameters<typeof validateStorageTable>[0]) =>
      validateStorageTable(rows).map((p) => p.message);
    expect(messages([{ elevation: 1, area: 1, storage: 1 }])).toEqual([
      'the table needs at least 2 rows, it has 1',
    ]);
    expect(
      messages([
        { elevation: 1, area: 5, storage: 10 },
        { elevation: 2, area: 4, storage: 9 },
      ]),
    ).toEqual([
      'row 2 (area): must not be below row 1 (5 m2)',
      'row 2 (storage): must not be below row 1 (10 m3)',
    ]);
    expect(
      messages([
        { elevation: 1, area: -1, storage: 0 },
        { elevation: 2, area: 1, storage: 1 },
      ]),
    ).toContain('row 1 (area): must not be negative (-1 m2)');
    expect(
      messages([
        { elevation: Number.NaN, area: 0, storage: 0 },
        { elevation: 2, area: 1, storage: 1 },
      ]),
    ).toContain('row 1 (elevation): must be a finite number');
    expect(
      messages([
        { elevation: 9500, area: 0, storage: 0 },
        { elevation: 9501, area: 1, storage: 1 },
      ]),
    ).toContain('row 1 (elevation): 9500 m is outside -500..9000 m');
  });
  it('warns (without failing the curve) when the storage increments contradict the areas', () => {
    const rows = [
      { elevation: 0, area: 100, storage: 0 },
      { elevation: 1, area: 100, storage: 1000 },
      { elevation: 2, area: 10000, storage: 1050 },
    ];
    const problems = validateStorageTable(rows);
    expect(problems.map((p) => [p.row, p.field, p.severity])).toEqual([
      [2, 'storage', 'warning'],
      [3, 'storage', 'warning'],
    ]);
    const c = createStorageCurve(rows);
    // row 3's area (10,000 m2 against a 50 m3 increment) would make the cubic overshoot: limited
    expect(c.limitedRows).toBeGreaterThan(0);
    expect(c.areaAt(2)).toBeLessThan(10000);
    expect(c.storageAt(1.5)).toBeGreaterThan(1000);
    expect(c.storageAt(1.5)).toBeLessThan(1050);
  });
});
