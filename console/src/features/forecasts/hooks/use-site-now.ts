import type { SiteClock } from '@stillwell/shared/telemetry';
import { useWallClock } from '../../../hooks/use-wall-clock';

/**
 * The site's now between status pushes: the last site clock, moved on by the wall time since it
 * arrived at the clock's speed (360x in the demo), so a countdown ticks in site time.
 */
export function siteNowAt(clock: SiteClock, receivedAtWallMs: number, wallNowMs: number): number {
  return clock.now + Math.max(0, wallNowMs - receivedAtWallMs) * clock.speed;
}

export function useSiteNow(clock: SiteClock | undefined, receivedAtWallMs: number): number | null {
  const wallNow = useWallClock(250);
  return clock ? siteNowAt(clock, receivedAtWallMs, wallNow) : null;
}
