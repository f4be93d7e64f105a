import type { ConfigService } from '@nestjs/config';
import type { DataSource } from 'typeorm';
import type { Env } from '../config';
import type { SiteClockService } from '../clock/site-clock.service';
import type { WriteQueueService } from '../database/write-queue.service';
import type { LogbookService } from '../logbook/logbook.service';
import type { DispatchService } from './dispatch.service';
import { EscalationService } from './escalation.service';

/**
 * The escalation timer with jest's fake timers: the checks run every NOTICE_TICK_MS of wall time,
 * never overlap, and stop with the module. What a check escalates is tested against a real
 * database in test/notices-escalation.e2e-spec.ts, on a site clock moved by hand.
 */
describe('EscalationService timer', () => {
  const make = (tickMs: number, run: () => Promise<unknown>) =>
    new EscalationService(
      {} as DataSource,
      { run } as unknown as WriteQueueService,
      {} as LogbookService,
      {} as SiteClockService,
      { deliver: jest.fn() } as unknown as DispatchService,
      { get: () => tickMs } as unknown as ConfigService<Env, true>,
    );

  beforeEach(() => jest.useFakeTimers());
  afterEach(() => jest.useRealTimers());

  it('checks every NOTICE_TICK_MS, not before, and stops when the module ends', async () => {
    const run = jest.fn().mockResolvedValue([]);
    const service = make(1000, run);
    service.onApplicationBootstrap();
    await jest.advanceTimersByTimeAsync(999);
    expect(run).not.toHaveBeenCalled();
    await jest.advanceTimersByTimeAsync(1);
    expect(run).toHaveBeenCalledTimes(1);
    await jest.advanceTimersByTimeAsync(3000);
    expect(run).toHaveBeenCalledTimes(4);
    service.onModuleDestroy();
    await jest.advanceTimersByTimeAsync(5000);
    expect(run).toHaveBeenCalledTimes(4);
  });

  it('does not start a check while the last one is still running', async () => {
    let finish: (v: unknown[]) => void = () => undefined;
    const run = jest.fn(() => new Promise<unknown[]>((resolve) => (finish = resolve)));
    const service = make(1000, run);
    service.onApplicationBootstrap();
    await jest.advanceTimersByTimeAsync(3000);
    expect(run).toHaveBeenCalledTimes(1);
    finish([]);
    await jest.advanceTimersByTimeAsync(1000);
    expect(run).toHaveBeenCalledTimes(2);
    service.onModuleDestroy();
  });

  it('runs no timer at all with NOTICE_TICK_MS 0 (tests drive tick themselves)', async () => {
    const run = jest.fn().mockResolvedValue([]);
    const service = make(0, run);
    service.onApplicationBootstrap();
    await jest.advanceTimersByTimeAsync(60_000);
    expect(run).not.toHaveBeenCalled();
    expect(jest.getTimerCount()).toBe(0);
  });
});
