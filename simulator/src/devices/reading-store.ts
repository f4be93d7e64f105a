import type { BackfillUnavailableReason } from '@stillwell/shared/telemetry';

interface Stored {
  seq: number;
  payload: string;
  /** handed to a connected link (the link's own QoS 1 store redelivers it after a reconnect) */
  sent: boolean;
}

export interface UnavailableRun {
  fromSeq: number;
  toSeq: number;
  reason: BackfillUnavailableReason;
}

/** The most runs a backfill answer lists; the rest of the range is folded into the last one. */
export const MAX_UNAVAILABLE_RUNS = 100;

/**
 * A field unit's store-and-forward memory: its last `capacity` readings by sequence number, each
 * marked sent or not. Readings that could not be sent wait here, in order, until the link is back;
 * the oldest are let go when it is full (an overrun), sent or not, and counted.
 */
export class ReadingStore {
  private readonly bySeq = new Map<number, Stored>();
  /** sequence numbers not yet sent, oldest first; `head` is the next to send */
  private unsent: number[] = [];
  private head = 0;
  /** readings let go while still unsent: lost for good */
  overrunUnsent = 0;
  /** every reading let go to make room */
  evicted = 0;

  constructor(readonly capacity: number) {
    if (!Number.isInteger(capacity) || capacity < 1)
      throw new RangeError(`buffer capacity must be a whole number of at least 1, got ${capacity}`);
  }

  get size(): number {
    return this.bySeq.size;
  }

  /** oldest sequence number held, or null when empty */
  get oldestSeq(): number | null {
    const first = this.bySeq.keys().next();
    return first.done ? null : first.value;
  }

  get unsentCount(): number {
    let n = 0;
    for (let i = this.head; i < this.unsent.length; i++) if (this.bySeq.has(this.unsent[i]!)) n++;
    return n;
  }

  /** Keeps a new reading (sequence numbers only ever grow), letting the oldest go when full. */
  add(seq: number, payload: string): void {
    this.bySeq.set(seq, { seq, payload, sent: false });
    this.unsent.push(seq);
    while (this.bySeq.size > this.capacity) {
      const oldest = this.bySeq.values().next().value!;
      this.bySeq.delete(oldest.seq);
      this.evicted++;
      if (!oldest.sent) this.overrunUnsent++;
    }
    // the unsent queue is in seq order, so what was let go unsent sits at its head
    while (this.head < this.unsent.length && !this.bySeq.has(this.unsent[this.head]!)) this.head++;
    this.compact();
  }

  /** The oldest unsent reading still held, without taking it. */
  peekUnsent(): { seq: number; payload: string } | null {
    while (this.head < this.unsent.length) {
      const entry = this.bySeq.get(this.unsent[this.head]!);
      if (entry && !entry.sent) return entry;
      this.head++;
    }
    return null;
  }

  markSent(seq: number): void {
    const entry = this.bySeq.get(seq);
    if (entry) entry.sent = true;
    if (this.unsent[this.head] === seq) this.head++;
    this.compact();
  }

  /**
   * What a backfill request for fromSeq..toSeq gets: the held readings already sent (an unsent one
   * goes out with the backlog anyway), and the runs of the range the store cannot send, with why.
   */
  lookup(
    fromSeq: number,
    toSeq: number,
    lastProduced: number,
  ): { resend: Array<{ seq: number; payload: string }>; unavailable: UnavailableRun[] } {
    const resend: Array<{ seq: number; payload: string }> = [];
    const unavailable: UnavailableRun[] = [];
    const oldest = this.oldestSeq ?? lastProduced + 1;
    const missing = (from: number, to: number) => {
      // split one missing run at the buffer's oldest reading and at the last one produced
      const cuts: Array<[number, number, BackfillUnavailableReason]> = [
        [from, Math.min(to, oldest - 1), 'overrun'],
        [Math.max(from, oldest), Math.min(to, lastProduced), 'not-held'],
        [Math.max(from, lastProduced + 1), to, 'not-produced'],
      ];
      for (const [a, b, reason] of cuts) {
        if (a > b) continue;
        const last = unavailable[unavailable.length - 1];
        if (unavailable.length >= MAX_UNAVAILABLE_RUNS && last) last.toSeq = b;
        else unavailable.push({ fromSeq: a, toSeq: b, reason });
      }
    };
    let next = fromSeq;
    // walk the store (at most `capacity` entries), never the requested range, which may be huge
    for (const entry of this.bySeq.values()) {
      if (entry.seq < fromSeq) continue;
      if (entry.seq > toSeq) break;
      if (entry.seq > next) missing(next, entry.seq - 1);
      if (entry.sent) resend.push(entry);
      next = entry.seq + 1;
    }
    if (next <= toSeq) missing(next, toSeq);
    return { resend, unavailable };
  }

  /** Drops the sent prefix of the unsent queue now and then, so it does not grow without end. */
  private compact(): void {
    if (this.head > 1024 && this.head * 2 > this.unsent.length) {
      this.unsent = this.unsent.slice(this.head);
      this.head = 0;
    }
  }
}
