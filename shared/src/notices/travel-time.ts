import type { TravelTimeRow } from './zones.js';

export interface TravelTimeEstimate {
  travelTimeS: number;
  /**
   * The release lies outside the engineer's table and the nearest row was used: 'above' means the
   * wave of a larger release may arrive earlier than this, so the notice says so.
   */
  beyondTable: 'below' | 'above' | null;
}

/**
 * The flood wave's travel time from the dam to a zone for a release, interpolated linearly between
 * the two rows of the engineer's table around it (rows in ascending release). Outside the table the
 * nearest row is used and flagged rather than extrapolated: a straight line past the last row can
 * run to zero or below, which is worse than an honest "beyond the table".
 */
export function travelTimeFor(
  table: readonly TravelTimeRow[],
  releaseM3s: number,
): TravelTimeEstimate {
  const first = table[0];
  const last = table[table.length - 1];
  if (!first || !last) throw new Error('a travel-time table needs at least one row');
  if (releaseM3s < first.releaseM3s)
    return { travelTimeS: first.travelTimeS, beyondTable: 'below' };
  if (releaseM3s > last.releaseM3s) return { travelTimeS: last.travelTimeS, beyondTable: 'above' };
  for (let i = 1; i < table.length; i++) {
    const lo = table[i - 1]!;
    const hi = table[i]!;
    if (releaseM3s <= hi.releaseM3s) {
      const f = (releaseM3s - lo.releaseM3s) / (hi.releaseM3s - lo.releaseM3s);
      return {
        travelTimeS: Math.round(lo.travelTimeS + f * (hi.travelTimeS - lo.travelTimeS)),
        beyondTable: null,
      };
    }
  }
  return { travelTimeS: last.travelTimeS, beyondTable: null };
}

/** A zone is affected by a release when the release reaches its threshold and the order raises the flow. */
export function isAffected(
  zone: { affectedAtM3s: number },
  targetReleaseM3s: number,
  currentReleaseM3s: number | null,
): boolean {
  if (targetReleaseM3s < zone.affectedAtM3s) return false;
  return currentReleaseM3s === null || targetReleaseM3s > currentReleaseM3s;
}
