import type { Quality, Reading, ReadingSeries } from '@stillwell/shared/telemetry';

export type PointLike = Pick<Reading, 't' | 'v' | 'q'>;

/**
 * Merges pushed readings into a cached series: ascending time, one point per time (the later
 * arrival wins, as the gateway's newest word on it), trimmed to the window before its newest point.
 * Returns the same series when nothing of this channel was given.
 */
export function appendReadings(
  series: ReadingSeries,
  readings: ReadonlyArray<PointLike & { channel: string }>,
  windowMs: number,
): ReadingSeries {
  const own = readings.filter((reading) => reading.channel === series.channel);
  if (own.length === 0) return series;
  own.sort((a, b) => a.t - b.t);

  let t: number[];
  let v: number[];
  let q: Quality[];
  const lastT = series.t.at(-1);
  const first = own[0];
  if (first && (lastT === undefined || first.t > lastT) && isStrictlyAscending(own)) {
    // The usual case: the batch is newer than everything held.
    t = [...series.t, ...own.map((r) => r.t)];
    v = [...series.v, ...own.map((r) => r.v)];
    q = [...series.q, ...own.map((r) => r.q)];
  } else {
    const byTime = new Map<number, PointLike>();
    series.t.forEach((time, i) => {
      byTime.set(time, { t: time, v: series.v[i] ?? Number.NaN, q: series.q[i] ?? 'bad' });
    });
    for (const reading of own) byTime.set(reading.t, reading);
    const points = [...byTime.values()].sort((a, b) => a.t - b.t);
    t = points.map((p) => p.t);
    v = points.map((p) => p.v);
    q = points.map((p) => p.q);
  }

  const newest = t.at(-1) ?? 0;
  const start = firstIndexAtOrAfter(t, newest - windowMs);
  if (start > 0) {
    t = t.slice(start);
    v = v.slice(start);
    q = q.slice(start);
  }
  return { ...series, t, v, q };
}

function isStrictlyAscending(points: ReadonlyArray<PointLike>): boolean {
  for (let i = 1; i < points.length; i += 1) {
    if ((points[i]?.t ?? 0) <= (points[i - 1]?.t ?? 0)) return false;
  }
  return true;
}

/** Binary search in an ascending array. */
function firstIndexAtOrAfter(values: readonly number[], bound: number): number {
  let lo = 0;
  let hi = values.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((values[mid] ?? Infinity) < bound) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
