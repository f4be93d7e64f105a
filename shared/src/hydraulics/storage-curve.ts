import type { StorageRow } from './schema.js';
import {
  hermiteInverse,
  hermiteSlope,
  hermiteValue,
  limitSlopes,
  segmentOf,
  valueSegmentOf,
} from './hermite.js';
import { StorageTableError, validateStorageTable } from './storage-validate.js';

/**
 * Storage as a function of pool elevation, and its inverse.
 *
 * Interpolation: a monotone cubic Hermite curve through the (elevation, storage) rows whose node
 * slopes are the tabulated areas (dS/dh = A), limited by the Fritsch-Carlson condition where the
 * area column disagrees with the storage increments. So storage is C1, strictly monotone where the
 * table is, exact at the rows, and areaAt(h) = dS/dh is the curve's own derivative (equal to the
 * tabulated area at the rows unless limiting was needed; see `limitedRows`).
 */
export interface StorageCurve {
  readonly minElevation: number;
  readonly maxElevation: number;
  readonly minStorage: number;
  readonly maxStorage: number;
  /** number of rows whose area had to be reduced to keep the curve monotone (0 for a sound table) */
  readonly limitedRows: number;
  /** storage, m3, at a pool elevation, m */
  storageAt(elevation: number): number;
  /** pool elevation, m, holding a storage, m3 (the lowest such elevation where storage is flat) */
  elevationAt(storage: number): number;
  /** water-surface area, m2, at a pool elevation (dS/dh of the curve) */
  areaAt(elevation: number): number;
  /** flat arrays for tight loops: knots, storages and node slopes (areas) */
  readonly knots: { elevation: Float64Array; storage: Float64Array; slope: Float64Array };
}

export interface StorageCurveOptions {
  /**
   * 'throw' (default): a value outside the table throws a RangeError naming it and the range.
   * 'clamp': values are clamped to the table (storageAt above the top returns the top storage,
   * areaAt outside returns the area at the nearer end). Clamping hides overtopping: use it only
   * for display.
   */
  outOfRange?: 'throw' | 'clamp';
}

const fmt = (v: number) => String(Number(v.toPrecision(10)));

export function createStorageCurve(
  rows: readonly StorageRow[],
  options: StorageCurveOptions = {},
): StorageCurve {
  const errors = validateStorageTable(rows).filter((p) => p.severity === 'error');
  if (errors.length > 0) throw new StorageTableError(errors);
  const clamp = options.outOfRange === 'clamp';
  const x = Float64Array.from(rows, (r) => r.elevation);
  const y = Float64Array.from(rows, (r) => r.storage);
  const d = Float64Array.from(rows, (r) => r.area);
  const limitedRows = limitSlopes(x, y, d);
  const n = x.length;
  const minElevation = x[0]!;
  const maxElevation = x[n - 1]!;
  const minStorage = y[0]!;
  const maxStorage = y[n - 1]!;

  const checkElevation = (h: number): number => {
    if (h >= minElevation && h <= maxElevation) return h;
    if (clamp && !Number.isNaN(h)) return h < minElevation ? minElevation : maxElevation;
    throw new RangeError(
      `elevation ${fmt(h)} m is outside the storage table (${fmt(minElevation)} to ${fmt(maxElevation)} m)`,
    );
  };
  const checkStorage = (s: number): number => {
    if (s >= minStorage && s <= maxStorage) return s;
    if (clamp && !Number.isNaN(s)) return s < minStorage ? minStorage : maxStorage;
    throw new RangeError(
      `storage ${fmt(s)} m3 is outside the storage table (${fmt(minStorage)} to ${fmt(maxStorage)} m3)`,
    );
  };

  return {
    minElevation,
    maxElevation,
    minStorage,
    maxStorage,
    limitedRows,
    knots: { elevation: x, storage: y, slope: d },
    storageAt(elevation) {
      const h = checkElevation(elevation);
      return hermiteValue(x, y, d, segmentOf(x, h), h);
    },
    elevationAt(storage) {
      const s = checkStorage(storage);
      return hermiteInverse(x, y, d, valueSegmentOf(y, s), s);
    },
    areaAt(elevation) {
      const h = checkElevation(elevation);
      return hermiteSlope(x, y, d, segmentOf(x, h), h);
    },
  };
}
