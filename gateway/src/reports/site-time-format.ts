/** Site times as the report prints them: in the site's zone, which the report names once. */
export function siteTimeFormatter(timeZone: string): {
  full: (ms: number) => string;
  short: (ms: number) => string;
} {
  const parts = (ms: number, opts: Intl.DateTimeFormatOptions) =>
    Object.fromEntries(
      new Intl.DateTimeFormat('en-GB', { timeZone, hourCycle: 'h23', ...opts })
        .formatToParts(ms)
        .map((p) => [p.type, p.value]),
    ) as Record<string, string>;
  return {
    full: (ms) => {
      const p = parts(ms, {
        year: 'numeric',
        month: '2-digit',
        day: '2-digit',
        hour: '2-digit',
        minute: '2-digit',
      });
      return `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute}`;
    },
    short: (ms) => {
      const p = parts(ms, { month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' });
      return `${p.day}/${p.month} ${p.hour}:${p.minute}`;
    },
  };
}

/** A duration as hours and minutes ("2 h 05 min", "-0 h 30 min" when negative). */
export function durationText(ms: number): string {
  const sign = ms < 0 ? '-' : '';
  const min = Math.round(Math.abs(ms) / 60_000);
  const h = Math.floor(min / 60);
  const m = min % 60;
  return h ? `${sign}${h} h ${String(m).padStart(2, '0')} min` : `${sign}${m} min`;
}
