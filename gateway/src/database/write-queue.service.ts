import { Injectable } from '@nestjs/common';

/**
 * SQLite through TypeORM's better-sqlite3 driver has one connection: two transactions at once fail.
 * Every write job goes through this queue, one after another, in the order they were given.
 */
@Injectable()
export class WriteQueueService {
  private tail: Promise<unknown> = Promise.resolve();
  private pending = 0;

  run<T>(job: () => Promise<T> | T): Promise<T> {
    this.pending += 1;
    const result = this.tail.then(job);
    this.tail = result.then(
      () => this.settle(),
      () => this.settle(),
    );
    return result;
  }

  /** Jobs waiting or running: a growing number means the writer cannot keep up. */
  get depth(): number {
    return this.pending;
  }

  /** Resolves when every job queued so far has finished. */
  async drain(): Promise<void> {
    while (this.pending > 0) await this.tail;
  }

  private settle(): void {
    this.pending -= 1;
  }
}
