import type { RatingTable } from './schema.js';
import { hermiteValue, pchipSlopes, segmentOf } from './hermite.js';

/** A problem in a user rating table; `row` counts from 1. */
export interface RatingTableProblem {
  row: number;
  field: 'elevation' | 'discharge' | 'table';
  message: string;
}

/**
 * Checks a rating table: at least 2 rows, finite values, strictly increasing elevation,
 * non-decreasing discharge, and a first discharge of 0 (the rating is 0 below the first row, so a
 * non-zero first discharge would make it jump).
 */
export function validateRatingTable(rows: RatingTable['rows']): RatingTableProblem[] {
  const out: RatingTableProblem[] = [];
  const add = (row: number, field: RatingTableProblem['field'], msg: string) =>
    out.push({ row, field, message: field === 'table' ? msg : `row ${row} (${field}): ${msg}` });
  if (rows.length < 2)
    add(rows.length, 'table', `the rating table needs at least 2 rows, it has ${rows.length}`);
  rows.forEach((r, i) => {
    const row = i + 1;
    if (!Number.isFinite(r.elevation)) add(row, 'elevation', 'must be a finite number');
    if (!Number.isFinite(r.discharge) || r.discharge < 0)
      add(row, 'discharge', 'must be a finite number >= 0');
    if (i === 0 && r.discharge !== 0) {
      add(
        row,
        'discharge',
        `must be 0 (the rating is 0 below the first row), not ${r.discharge} m3/s`,
      );
    }
    const p = rows[i - 1];
    if (!p) return;
    if (!(r.elevation > p.elevation))
      add(row, 'elevation', `must be above row ${i} (${p.elevation} m)`);
    if (r.discharge < p.discharge)
      add(row, 'discharge', `must not be below row ${i} (${p.discharge} m3/s)`);
  });
  return out;
}

/** Thrown when a rating table cannot be used. */
export class RatingTableError extends Error {
  readonly problems: RatingTableProblem[];
  constructor(id: string, problems: RatingTableProblem[]) {
    super(`invalid rating table "${id}": ${problems.map((p) => p.message).join('; ')}`);
    this.name = 'RatingTableError';
    this.problems = problems;
  }
}

export interface CompiledRating {
  /** discharge at a pool elevation: 0 below the first row, linear extrapolation above the last */
  at(elevation: number): number;
  readonly maxElevation: number;
}

const cache = new WeakMap<RatingTable, CompiledRating>();

/**
 * Compiles a rating table (cached per table object). Above the last row the rating is extended
 * with the last segment's slope (continuous, non-decreasing) and the breakdown flags it.
 */
export function compileRating(table: RatingTable): CompiledRating {
  const hit = cache.get(table);
  if (hit) return hit;
  const problems = validateRatingTable(table.rows);
  if (problems.length > 0) throw new RatingTableError(table.id, problems);
  const x = Float64Array.from(table.rows, (r) => r.elevation);
  const y = Float64Array.from(table.rows, (r) => r.discharge);
  const n = x.length;
  const linear = table.interpolation === 'linear';
  const d = linear ? new Float64Array(n) : pchipSlopes(x, y);
  const x0 = x[0]!;
  const xn = x[n - 1]!;
  const yn = y[n - 1]!;
  const lastSlope = (yn - y[n - 2]!) / (xn - x[n - 2]!);
  const compiled: CompiledRating = {
    maxElevation: xn,
    at(h) {
      if (!(h > x0)) return 0;
      if (h >= xn) return yn + lastSlope * (h - xn);
      const i = segmentOf(x, h);
      if (linear) return y[i]! + ((y[i + 1]! - y[i]!) * (h - x[i]!)) / (x[i + 1]! - x[i]!);
      return hermiteValue(x, y, d, i, h);
    },
  };
  cache.set(table, compiled);
  return compiled;
}
