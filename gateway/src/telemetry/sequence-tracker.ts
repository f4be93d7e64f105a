/** How a message's sequence number relates to what the device sent before. */
export type SequenceVerdict =
  | { kind: 'next' }
  | { kind: 'gap'; fromSeq: number; toSeq: number }
  | { kind: 'restart' }
  | { kind: 'late' };

/**
 * Follows each device's sequence numbers. A jump forward is a gap (messages lost or still to come);
 * a lower number with a later time is a device that restarted its counter; a lower number with an
 * earlier time is a late or repeated delivery, stored (idempotently) but not news.
 */
export class SequenceTracker {
  private readonly last = new Map<string, { seq: number; time: number }>();

  seed(key: string, seq: number, time: number): void {
    this.last.set(key, { seq, time });
  }

  observe(key: string, seq: number, time: number): SequenceVerdict {
    const last = this.last.get(key);
    if (!last || seq === last.seq + 1) {
      this.last.set(key, { seq, time });
      return { kind: 'next' };
    }
    if (seq > last.seq) {
      this.last.set(key, { seq, time });
      return { kind: 'gap', fromSeq: last.seq + 1, toSeq: seq - 1 };
    }
    if (seq < last.seq && time > last.time) {
      this.last.set(key, { seq, time });
      return { kind: 'restart' };
    }
    return { kind: 'late' };
  }
}
