/**
 * A datetime-local field holds a wall-clock time with no zone; here it is the site's wall clock,
 * whatever zone the browser is in. Conversions go through Intl, which knows the site zone's rules.
 */
const offsetFormats = new Map<string, Intl.DateTimeFormat>();

/** The site zone's offset from UTC at a moment, ms (positive east of Greenwich). */
export function zoneOffsetMs(epochMs: number, timeZone: string): number {
  let format = offsetFormats.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-GB', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    offsetFormats.set(timeZone, format);
  }
  const part = (type: Intl.DateTimeFormatPartTypes) =>
    Number(format.formatToParts(epochMs).find((p) => p.type === type)?.value);
  const wall = Date.UTC(
    part('year'),
    part('month') - 1,
    part('day'),
    part('hour'),
    part('minute'),
    part('second'),
  );
  return wall - Math.floor(epochMs / 1000) * 1000;
}

/** A moment as the field's text, "2026-03-03T14:05", on the site's wall clock. */
export function toSiteField(epochMs: number, timeZone: string): string {
  return new Date(epochMs + zoneOffsetMs(epochMs, timeZone)).toISOString().slice(0, 16);
}

/**
 * The field's text read on the site's wall clock, epoch ms; NaN when it is not a time. A wall time
 * that a clock change skips or repeats takes the offset in force just after it.
 */
export function fromSiteField(text: string, timeZone: string): number {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/.test(text)) return NaN;
  const wall = Date.parse(`${text}:00Z`);
  if (!Number.isFinite(wall)) return NaN;
  const first = wall - zoneOffsetMs(wall, timeZone);
  return wall - zoneOffsetMs(first, timeZone);
}
