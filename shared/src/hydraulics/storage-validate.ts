import type { StorageRow } from './schema.js';

/**
 * One problem found in an elevation-area-storage table. `row` counts from 1 (the first data row),
 * as in the message. Errors make the table unusable; warnings flag a table that is usable but
 * physically doubtful (the area column disagrees with the storage increments).
 */
export interface StorageTableProblem {
  row: number;
  field: 'elevation' | 'area' | 'storage' | 'table';
  message: string;
  severity: 'error' | 'warning';
}

/** Physical ranges: elevations of any dam on Earth, and areas/storages above the largest reservoirs. */
export const STORAGE_LIMITS = {
  minElevation: -500,
  maxElevation: 9000,
  /** 1e11 m2 = 100,000 km2 (Lake Volta, the largest reservoir by area, is about 8,500 km2) */
  maxArea: 1e11,
  /** 1e13 m3 (Lake Kariba, the largest by volume, is about 1.85e11 m3) */
  maxStorage: 1e13,
} as const;

/**
 * Relative tolerance of the area/storage consistency check: with an area that does not decrease
 * between two rows, the storage increment must lie between A_i dh and A_{i+1} dh.
 */
const CONSISTENCY_TOLERANCE = 0.02;

function fmt(v: number): string {
  return Number.isInteger(v) ? String(v) : String(Number(v.toPrecision(10)));
}

/** Checks a storage table; returns every problem found (empty when the table is sound). */
export function validateStorageTable(rows: readonly StorageRow[]): StorageTableProblem[] {
  const problems: StorageTableProblem[] = [];
  const err = (row: number, field: StorageTableProblem['field'], message: string) =>
    problems.push({ row, field, message: `row ${row} (${field}): ${message}`, severity: 'error' });
  if (rows.length < 2) {
    problems.push({
      row: rows.length,
      field: 'table',
      message: `the table needs at least 2 rows, it has ${rows.length}`,
      severity: 'error',
    });
  }
  rows.forEach((r, i) => {
    const row = i + 1;
    const fields = [
      ['elevation', r.elevation],
      ['area', r.area],
      ['storage', r.storage],
    ] as const;
    let finite = true;
    for (const [field, v] of fields) {
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        err(row, field, 'must be a finite number');
        finite = false;
      }
    }
    if (!finite) return;
    if (r.elevation < STORAGE_LIMITS.minElevation || r.elevation > STORAGE_LIMITS.maxElevation) {
      err(
        row,
        'elevation',
        `${fmt(r.elevation)} m is outside ${STORAGE_LIMITS.minElevation}..${STORAGE_LIMITS.maxElevation} m`,
      );
    }
    if (r.area < 0) err(row, 'area', `must not be negative (${fmt(r.area)} m2)`);
    else if (r.area > STORAGE_LIMITS.maxArea)
      err(row, 'area', `${fmt(r.area)} m2 is above ${STORAGE_LIMITS.maxArea} m2`);
    if (r.storage < 0) err(row, 'storage', `must not be negative (${fmt(r.storage)} m3)`);
    else if (r.storage > STORAGE_LIMITS.maxStorage) {
      err(row, 'storage', `${fmt(r.storage)} m3 is above ${STORAGE_LIMITS.maxStorage} m3`);
    }
    const p = i > 0 ? rows[i - 1] : undefined;
    if (!p || ![p.elevation, p.area, p.storage].every(Number.isFinite)) return;
    if (!(r.elevation > p.elevation)) {
      err(row, 'elevation', `must be above row ${i} (${fmt(p.elevation)} m)`);
      return;
    }
    if (r.area < p.area) err(row, 'area', `must not be below row ${i} (${fmt(p.area)} m2)`);
    if (r.storage < p.storage)
      err(row, 'storage', `must not be below row ${i} (${fmt(p.storage)} m3)`);
    if (r.area >= p.area && r.storage >= p.storage) {
      const dh = r.elevation - p.elevation;
      const ds = r.storage - p.storage;
      const lo = p.area * dh;
      const hi = r.area * dh;
      if (
        ds < lo * (1 - CONSISTENCY_TOLERANCE) - 1e-9 ||
        ds > hi * (1 + CONSISTENCY_TOLERANCE) + 1e-9
      ) {
        problems.push({
          row,
          field: 'storage',
          message:
            `row ${row} (storage): the increment from row ${i}, ${fmt(ds)} m3, is outside ` +
            `${fmt(lo)}..${fmt(hi)} m3 (area x rise at the two rows); area and storage disagree`,
          severity: 'warning',
        });
      }
    }
  });
  return problems;
}

/** Thrown by createStorageCurve for a table with errors; carries every problem. */
export class StorageTableError extends Error {
  readonly problems: StorageTableProblem[];
  constructor(problems: StorageTableProblem[]) {
    super(`invalid storage table: ${problems.map((p) => p.message).join('; ')}`);
    this.name = 'StorageTableError';
    this.problems = problems;
  }
}
