import { describe, expect, it } from 'vitest';
import { MAX_UNAVAILABLE_RUNS, ReadingStore } from './reading-store.js';

const filled = (capacity: number, count: number) => {
  const store = new ReadingStore(capacity);
  for (let seq = 0; seq < count; seq++) store.add(seq, `r${seq}`);
  return store;
};

describe('ReadingStore', () => {
  it('hands out unsent readings oldest first and holds them after they are sent', () => {
    const store = filled(10, 3);
    const order: number[] = [];
    for (let next = store.peekUnsent(); next; next = store.peekUnsent()) {
      order.push(next.seq);
      store.markSent(next.seq);
    }
    expect(order).toEqual([0, 1, 2]);
    expect(store.size).toBe(3);
    expect(store.unsentCount).toBe(0);
  });

  it('lets the oldest go when full and counts the unsent ones it lost', () => {
    const store = new ReadingStore(3);
    store.add(0, 'a');
    store.markSent(0);
    for (const seq of [1, 2, 3, 4]) store.add(seq, 'x');
    expect(store.oldestSeq).toBe(2);
    expect(store.evicted).toBe(2);
    expect(store.overrunUnsent).toBe(1);
    expect(store.peekUnsent()?.seq).toBe(2);
  });

  it('answers a backfill with the sent readings held and says why the rest is unavailable', () => {
    const store = new ReadingStore(5);
    for (const seq of [0, 1, 2, 3, 4, 5, 6, 8, 9]) {
      store.add(seq, `r${seq}`);
      store.markSent(seq);
    }
    // held: 4, 5, 6, 8, 9 (7 never stored), produced up to 9
    const { resend, unavailable } = store.lookup(2, 12, 9);
    expect(resend.map((r) => r.seq)).toEqual([4, 5, 6, 8, 9]);
    expect(unavailable).toEqual([
      { fromSeq: 2, toSeq: 3, reason: 'overrun' },
      { fromSeq: 7, toSeq: 7, reason: 'not-held' },
      { fromSeq: 10, toSeq: 12, reason: 'not-produced' },
    ]);
  });

  it('leaves unsent readings to the backlog rather than sending them twice', () => {
    const store = filled(10, 4);
    store.markSent(0);
    const { resend, unavailable } = store.lookup(0, 3, 3);
    expect(resend.map((r) => r.seq)).toEqual([0]);
    expect(unavailable).toEqual([]);
  });

  it('lists at most the bounded number of unavailable runs, however many holes there are', () => {
    const store = new ReadingStore(1000);
    for (let seq = 0; seq < 1000; seq += 2) {
      store.add(seq, 'x');
      store.markSent(seq);
    }
    const { resend, unavailable } = store.lookup(0, 999, 999);
    expect(resend).toHaveLength(500);
    expect(unavailable).toHaveLength(MAX_UNAVAILABLE_RUNS);
    expect(unavailable.at(-1)?.toSeq).toBe(999);
  });

  it('refuses a capacity that is not a whole number of at least 1', () => {
    expect(() => new ReadingStore(0)).toThrow(/buffer capacity/);
  });
});
