/** Plant time: starts at a chosen instant and runs `speed` times faster than the wall clock. */
export class PlantClock {
  private wallAnchorMs: number;
  private plantAnchorMs: number;

  constructor(
    readonly plantStartMs: number,
    readonly speed: number,
    wallStartMs: number,
  ) {
    if (!(speed > 0)) throw new RangeError(`speed must be positive, got ${speed}`);
    this.wallAnchorMs = wallStartMs;
    this.plantAnchorMs = plantStartMs;
  }

  /** Where plant time should be at this wall-clock instant. */
  nominalAt(wallMs: number): number {
    return this.plantAnchorMs + (wallMs - this.wallAnchorMs) * this.speed;
  }

  /**
   * Re-anchors the clock so that it shows `plantMs` at `wallMs`. Used when the model falls too far
   * behind: the plant then runs late instead of piling up work it can never catch up on.
   */
  rebase(plantMs: number, wallMs: number): void {
    this.plantAnchorMs = plantMs;
    this.wallAnchorMs = wallMs;
  }
}

/** Start of the minute containing `ms` (plant time starts on a whole minute). */
export function floorToMinute(ms: number): number {
  return Math.floor(ms / 60_000) * 60_000;
}
