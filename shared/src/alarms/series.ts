/**
 * A channel's good readings in time order, kept for as long as some condition needs to look back.
 * Readings that arrive out of order are dropped: the gateway sends only the ones that are news.
 */
export class TimeSeries {
  private ts: number[] = [];
  private vs: number[] = [];

  constructor(private readonly keepMs: number) {}

  get length(): number {
    return this.ts.length;
  }

  push(t: number, v: number): boolean {
    const last = this.ts[this.ts.length - 1];
    if (last !== undefined && t <= last) return false;
    this.ts.push(t);
    this.vs.push(v);
    const cutoff = t - this.keepMs;
    if (this.ts[0]! < cutoff) {
      let drop = 0;
      while (drop < this.ts.length && this.ts[drop]! < cutoff) drop++;
      this.ts.splice(0, drop);
      this.vs.splice(0, drop);
    }
    return true;
  }

  latest(): { t: number; v: number } | null {
    const n = this.ts.length;
    return n ? { t: this.ts[n - 1]!, v: this.vs[n - 1]! } : null;
  }

  /** Points with from <= t <= to, oldest first. */
  between(from: number, to: number): Array<{ t: number; v: number }> {
    const out: Array<{ t: number; v: number }> = [];
    for (let i = this.firstAtOrAfter(from); i < this.ts.length && this.ts[i]! <= to; i++) {
      out.push({ t: this.ts[i]!, v: this.vs[i]! });
    }
    return out;
  }

  /** Mean value and mean time of the points in [from, to]; null with fewer than `min`. */
  mean(from: number, to: number, min = 1): { v: number; t: number; n: number } | null {
    let sv = 0;
    let st = 0;
    let n = 0;
    for (let i = this.firstAtOrAfter(from); i < this.ts.length && this.ts[i]! <= to; i++) {
      sv += this.vs[i]!;
      st += this.ts[i]!;
      n++;
    }
    return n >= min ? { v: sv / n, t: st / n, n } : null;
  }

  /**
   * Integral of the series over [a, b] (value x ms), linear between points, by the trapezoid
   * rule. Null when the points do not cover [a, b] or leave a hole longer than maxGapMs.
   */
  integral(a: number, b: number, maxGapMs: number): number | null {
    const pts = this.between(a - maxGapMs, b + maxGapMs);
    if (pts.length < 2 || pts[0]!.t > a || pts[pts.length - 1]!.t < b) return null;
    let sum = 0;
    for (let i = 1; i < pts.length; i++) {
      const p = pts[i - 1]!;
      const q = pts[i]!;
      if (q.t <= a || p.t >= b) continue;
      if (q.t - p.t > maxGapMs) return null;
      const lo = Math.max(a, p.t);
      const hi = Math.min(b, q.t);
      const slope = (q.v - p.v) / (q.t - p.t);
      const vLo = p.v + slope * (lo - p.t);
      const vHi = p.v + slope * (hi - p.t);
      sum += ((vLo + vHi) / 2) * (hi - lo);
    }
    return sum;
  }

  private firstAtOrAfter(t: number): number {
    let lo = 0;
    let hi = this.ts.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.ts[mid]! < t) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }
}
