import type { SiteClockService } from '../clock/site-clock.service';

/**
 * The site's "now" in whole ms. Lead times, escalation windows and every notice time run on the
 * site clock (the plant clock in the demo, hundreds of times faster than the wall), never on the
 * wall clock: a 2-hour lead time must pass in plant hours. Whole ms because they are stored as
 * integers and compared for equality.
 */
export function siteNow(clock: SiteClockService, reservoirId: string): number {
  return Math.floor(clock.now(reservoirId));
}
