import { formatAge, formatSiteTime } from '../../../lib/format';

/** A moment of the report on the site's clock: "Tue 3 Mar 2026 14:05 GMT". */
export function siteMoment(epochMs: number, timeZone: string): string {
  const s = formatSiteTime(epochMs, timeZone);
  return `${s.date} ${s.time.slice(0, 5)} ${s.zone}`;
}

/** A span of time, ms; signed when it is a difference (early or late). */
export function spanText(ms: number | null, signed = false): string {
  if (ms === null) return '–';
  const text = formatAge(Math.abs(ms) / 1000);
  if (!signed || Math.round(ms / 1000) === 0) return text;
  return ms < 0 ? `${text} early` : `${text} late`;
}

/** A difference in metres with its sign, "+0.125 m". */
export function signedMetres(value: number | null, decimals = 3): string {
  if (value === null) return '–';
  const text = Math.abs(value).toFixed(decimals);
  return `${value > 0 ? '+' : value < 0 ? '−' : '±'}${text} m`;
}
