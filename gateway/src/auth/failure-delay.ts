export interface FailureDelayOptions {
  /** failures allowed before the first wait */
  freeFailures: number;
  firstDelayS: number;
  maxDelayS: number;
  /** failures older than this are forgotten */
  forgetAfterMs?: number;
  /** accounts tracked at most (the oldest are dropped): unknown usernames cost memory too */
  maxEntries?: number;
}

interface Entry {
  failures: number;
  lastFailureAt: number;
  blockedUntil: number;
}

/**
 * A growing per-account wait after repeated failures: none for the first few, then a first delay
 * doubling with each further failure up to a cap (NIST SP 800-63B 5.2.2 rate limiting). Kept by
 * the username as typed (normalised), whether or not the account exists, so the waits reveal
 * nothing about who exists. In memory: a restart forgets it (the per-address throttle remains).
 */
export class FailureDelay {
  private readonly entries = new Map<string, Entry>();

  constructor(
    private readonly options: FailureDelayOptions,
    private readonly now: () => number = Date.now,
  ) {}

  /** Seconds to wait before this account may try again; 0 when it may now. */
  retryAfterS(key: string): number {
    const e = this.fresh(key);
    if (!e) return 0;
    const left = e.blockedUntil - this.now();
    return left > 0 ? Math.ceil(left / 1000) : 0;
  }

  /** Counts a failure; returns the wait it starts, s (0 while failures are still free). */
  failed(key: string): number {
    const now = this.now();
    const e = this.fresh(key) ?? { failures: 0, lastFailureAt: now, blockedUntil: 0 };
    e.failures += 1;
    e.lastFailureAt = now;
    const over = e.failures - this.options.freeFailures;
    const waitS =
      over < 0 ? 0 : Math.min(this.options.firstDelayS * 2 ** over, this.options.maxDelayS);
    e.blockedUntil = now + waitS * 1000;
    this.entries.delete(key); // re-insert: Map order is then oldest failure first
    this.entries.set(key, e);
    this.prune();
    return waitS;
  }

  succeeded(key: string): void {
    this.entries.delete(key);
  }

  private fresh(key: string): Entry | undefined {
    const e = this.entries.get(key);
    if (
      e &&
      this.now() - e.lastFailureAt > (this.options.forgetAfterMs ?? 24 * 3600_000) &&
      e.blockedUntil <= this.now()
    ) {
      this.entries.delete(key);
      return undefined;
    }
    return e;
  }

  private prune(): void {
    const max = this.options.maxEntries ?? 10_000;
    for (const key of this.entries.keys()) {
      if (this.entries.size <= max) break;
      this.entries.delete(key);
    }
  }
}
