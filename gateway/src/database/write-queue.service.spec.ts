import { WriteQueueService } from './write-queue.service';

describe('WriteQueueService', () => {
  it('runs jobs one at a time in order, even when they are async', async () => {
    const queue = new WriteQueueService();
    const log: string[] = [];
    let running = 0;
    const job = (name: string, ms: number) => async () => {
      running += 1;
      expect(running).toBe(1);
      log.push(`start ${name}`);
      await new Promise((r) => setTimeout(r, ms));
      log.push(`end ${name}`);
      running -= 1;
      return name;
    };
    const results = await Promise.all([
      queue.run(job('a', 20)),
      queue.run(job('b', 1)),
      queue.run(job('c', 5)),
    ]);
    expect(results).toEqual(['a', 'b', 'c']);
    expect(log).toEqual(['start a', 'end a', 'start b', 'end b', 'start c', 'end c']);
    expect(queue.depth).toBe(0);
  });

  it('keeps going after a failed job and reports the failure to its caller only', async () => {
    const queue = new WriteQueueService();
    const failed = queue.run(() => Promise.reject(new Error('disk full')));
    const next = queue.run(() => 42);
    await expect(failed).rejects.toThrow('disk full');
    await expect(next).resolves.toBe(42);
  });
});
