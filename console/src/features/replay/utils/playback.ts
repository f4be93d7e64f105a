/** Replay speeds offered, site seconds per wall second. */
export const SPEEDS = [1, 10, 60, 360, 3600] as const;
export type Speed = (typeof SPEEDS)[number];

/** One step of the step buttons, site ms. */
export const STEP_MS = 5 * 60_000;

export interface Playback {
  cursorMs: number;
  playing: boolean;
  speed: Speed;
}

/** The cursor after `wallMs` of playing: it stops (and pauses) at the window's end. */
export function advance(p: Playback, wallMs: number, endMs: number): Playback {
  if (!p.playing) return p;
  const cursorMs = p.cursorMs + wallMs * p.speed;
  return cursorMs >= endMs ? { ...p, cursorMs: endMs, playing: false } : { ...p, cursorMs };
}

export const clamp = (ms: number, fromMs: number, toMs: number) =>
  Math.min(toMs, Math.max(fromMs, ms));

/** Index of the last item at or before `atMs` in a list sorted by time; -1 when none. */
export function lastAtOrBefore<T>(items: readonly T[], atMs: number, timeOf: (x: T) => number) {
  let lo = 0;
  let hi = items.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (timeOf(items[mid]!) <= atMs) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

/** The value a series showed at `atMs`: its last point at or before; null before the first. */
export function valueAt(t: readonly number[], v: readonly number[], atMs: number): number | null {
  const i = lastAtOrBefore(t, atMs, (x) => x);
  return i < 0 ? null : v[i]!;
}
