/** A reading's site time and the gateway's wall time of receipt: one point of the clock mapping. */
export interface ClockAnchor {
  siteMs: number;
  wallMs: number;
}

/**
 * Site time from wall time, by the straight line through the window's first and last anchors.
 * In production the site clock is the wall clock and this is the identity (less transmission
 * delay); in the demo the plant clock runs `speed` times faster and the line has that slope.
 */
export class ClockMapping {
  private readonly rate: number;

  constructor(
    private readonly a: ClockAnchor | null,
    b: ClockAnchor | null,
  ) {
    this.rate =
      a && b && b.wallMs > a.wallMs && b.siteMs > a.siteMs
        ? (b.siteMs - a.siteMs) / (b.wallMs - a.wallMs)
        : 1;
  }

  toSite(wallMs: number): number {
    return this.a ? this.a.siteMs + (wallMs - this.a.wallMs) * this.rate : wallMs;
  }

  toWall(siteMs: number): number {
    return this.a ? this.a.wallMs + (siteMs - this.a.siteMs) / this.rate : siteMs;
  }
}

/** The site time an entry names itself (payload.siteTime, ISO 8601), or null. */
export function recordedSiteTime(payload: Record<string, unknown>): number | null {
  const t = payload.siteTime;
  if (typeof t !== 'string') return null;
  const ms = Date.parse(t);
  return Number.isFinite(ms) ? ms : null;
}
