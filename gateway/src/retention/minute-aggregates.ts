export const MINUTE_MS = 60_000;

export const floorMinute = (ms: number): number => Math.floor(ms / MINUTE_MS) * MINUTE_MS;

export interface RawReading {
  time: number;
  value: number;
  quality: string;
  received_at: number;
}

export interface MinuteAggregate {
  minute: number;
  count: number;
  min: number | null;
  minTime: number | null;
  max: number | null;
  maxTime: number | null;
  mean: number | null;
  suspectCount: number;
  badCount: number;
  firstReceivedAt: number;
}

/**
 * One channel's readings (sorted by time) folded into one aggregate per minute. Bad readings are
 * counted but kept out of the statistics; the first of equal extremes keeps its time.
 */
export function foldMinutes(rows: readonly RawReading[]): MinuteAggregate[] {
  const out: MinuteAggregate[] = [];
  let cur: (MinuteAggregate & { sum: number }) | undefined;
  for (const r of rows) {
    const minute = floorMinute(r.time);
    if (!cur || cur.minute !== minute) {
      if (cur) out.push(finish(cur));
      cur = {
        minute,
        count: 0,
        min: null,
        minTime: null,
        max: null,
        maxTime: null,
        mean: null,
        suspectCount: 0,
        badCount: 0,
        firstReceivedAt: r.received_at,
        sum: 0,
      };
    }
    cur.firstReceivedAt = Math.min(cur.firstReceivedAt, r.received_at);
    if (r.quality === 'bad') {
      cur.badCount += 1;
      continue;
    }
    if (r.quality === 'suspect') cur.suspectCount += 1;
    cur.count += 1;
    cur.sum += r.value;
    if (cur.min === null || r.value < cur.min) [cur.min, cur.minTime] = [r.value, r.time];
    if (cur.max === null || r.value > cur.max) [cur.max, cur.maxTime] = [r.value, r.time];
  }
  if (cur) out.push(finish(cur));
  return out;
}

function finish(a: MinuteAggregate & { sum: number }): MinuteAggregate {
  const { sum, ...rest } = a;
  return { ...rest, mean: a.count ? sum / a.count : null };
}

export const HOUR_MS = 3_600_000;

export const floorHour = (ms: number): number => Math.floor(ms / HOUR_MS) * HOUR_MS;

/** Minute aggregates (sorted) rolled up per hour: counts summed, extremes kept, mean weighted. */
export function foldHours(minutes: readonly MinuteAggregate[]): MinuteAggregate[] {
  const out: MinuteAggregate[] = [];
  let cur: (MinuteAggregate & { sum: number }) | undefined;
  for (const m of minutes) {
    const hour = floorHour(m.minute);
    if (!cur || cur.minute !== hour) {
      if (cur) out.push(finish(cur));
      cur = {
        ...m,
        minute: hour,
        count: 0,
        suspectCount: 0,
        badCount: 0,
        sum: 0,
        min: null,
        minTime: null,
        max: null,
        maxTime: null,
      };
    }
    cur.firstReceivedAt = Math.min(cur.firstReceivedAt, m.firstReceivedAt);
    cur.suspectCount += m.suspectCount;
    cur.badCount += m.badCount;
    if (!m.count) continue;
    cur.count += m.count;
    cur.sum += (m.mean ?? 0) * m.count;
    if (cur.min === null || m.min! < cur.min) [cur.min, cur.minTime] = [m.min, m.minTime];
    if (cur.max === null || m.max! > cur.max) [cur.max, cur.maxTime] = [m.max, m.maxTime];
  }
  if (cur) out.push(finish(cur));
  return out;
}
