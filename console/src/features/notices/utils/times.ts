import { formatDuration, formatSiteTime } from '@stillwell/shared/notices';

/** A site time in the site's zone, or a dash. */
export function siteTime(ms: number | null, timeZone: string): string {
  return ms === null ? '—' : formatSiteTime(ms, timeZone);
}

export function minutes(seconds: number): string {
  return formatDuration(seconds);
}
