/** Least-squares slope of value over time, per hour; null with fewer than two points or no time spread. */
export function slopePerHour(points: ReadonlyArray<{ t: number; v: number }>): number | null {
  const n = points.length;
  if (n < 2) return null;
  let st = 0;
  let sv = 0;
  for (const p of points) {
    st += p.t;
    sv += p.v;
  }
  const mt = st / n;
  const mv = sv / n;
  let num = 0;
  let den = 0;
  for (const p of points) {
    const dt = p.t - mt;
    num += dt * (p.v - mv);
    den += dt * dt;
  }
  if (den === 0) return null;
  return (num / den) * 3_600_000; // per ms -> per hour
}
