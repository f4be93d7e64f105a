/** Display choices shared by every screen. */

/** One locale for numbers and times, so that a screen reads the same on every workstation. */
export const DISPLAY_LOCALE = 'en-GB';

/** How much site time the live chart shows. */
export const CHART_WINDOW_HOURS = 6;
export const CHART_WINDOW_MS = CHART_WINDOW_HOURS * 3_600_000;

/** The gateway pushes a status about every second: this much wall time without one means it is overdue. */
export const STATUS_OVERDUE_MS = 10_000;

/** While the live connection is down, the status is fetched over REST this often (wall time). */
export const STATUS_POLL_MS = 5_000;
