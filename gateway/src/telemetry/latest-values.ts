import type { Reading as LiveReading } from '@stillwell/shared/telemetry';

const HISTORY_MS = 60 * 60 * 1000;

/** The latest reading of each channel, and a short history of each for rates of change. */
export class LatestValues {
  private readonly latest = new Map<string, LiveReading>();
  private readonly history = new Map<string, Array<{ t: number; v: number }>>();

  /** Keeps a reading if it is newer than the one held; good readings also go into the history. */
  update(r: LiveReading): void {
    const held = this.latest.get(r.channel);
    if (held && held.t >= r.t) return;
    this.latest.set(r.channel, r);
    if (r.q !== 'good') return;
    let h = this.history.get(r.channel);
    if (!h) this.history.set(r.channel, (h = []));
    h.push({ t: r.t, v: r.v });
    const cutoff = r.t - HISTORY_MS;
    let drop = 0;
    while (drop < h.length && h[drop]!.t < cutoff) drop += 1;
    if (drop) h.splice(0, drop);
  }

  get(channel: string): LiveReading | undefined {
    return this.latest.get(channel);
  }

  all(): LiveReading[] {
    return [...this.latest.values()];
  }

  /** Good readings of a channel since a time, oldest first. */
  since(channel: string, fromMs: number): Array<{ t: number; v: number }> {
    return (this.history.get(channel) ?? []).filter((p) => p.t >= fromMs);
  }
}
