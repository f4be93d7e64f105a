/** Times and durations in the words the decisions' messages use (site zone, named). */

const formats = new Map<string, Intl.DateTimeFormat>();

export function siteTimeText(epochMs: number, timeZone: string): string {
  let f = formats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', {
      timeZone,
      day: 'numeric',
      month: 'short',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
      timeZoneName: 'short',
    });
    formats.set(timeZone, f);
  }
  return f.format(epochMs);
}

/** 2 h 05 min, 45 min, under a minute. */
export function durationText(seconds: number): string {
  const s = Math.abs(seconds);
  if (s < 60) return 'under a minute';
  const minutes = Math.floor(s / 60);
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  if (h === 0) return `${m} min`;
  return `${h} h ${String(m).padStart(2, '0')} min`;
}

export const metres = (v: number) => `${v.toFixed(2)} m`;
