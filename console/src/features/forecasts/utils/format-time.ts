import { formatSiteTime } from '../../../lib/format';

/** HH:MM and the zone, e.g. 14:05 GMT: the way a forecast names a moment of site time. */
export function siteClockText(epochMs: number, timeZone: string): string {
  const shown = formatSiteTime(epochMs, timeZone);
  return `${shown.time.slice(0, 5)} ${shown.zone}`;
}

/** A lead time in site seconds: 2 h 05 min, 45 min, under a minute. */
export function leadText(seconds: number): string {
  const s = Math.abs(seconds);
  if (s < 60) return 'under a minute';
  const minutes = Math.floor(s / 60);
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  return h === 0 ? `${m} min` : `${h} h ${String(m).padStart(2, '0')} min`;
}
