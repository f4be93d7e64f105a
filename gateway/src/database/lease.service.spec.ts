import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { ConfigService } from '@nestjs/config';
import { DataSource } from 'typeorm';
import type { Env } from '../config';
import { LeaseService } from './lease.service';
import { JobLeases1765152000000 } from './migrations/1765152000000-job-leases';
import { WriteQueueService } from './write-queue.service';

const config = (mode: 'local' | 'database') =>
  ({ get: (k: string) => (k === 'JOB_LEASES' ? mode : undefined) }) as unknown as ConfigService<
    Env,
    true
  >;

describe('LeaseService: one holder per job, handed on when it expires', () => {
  let dir: string;
  let ds: DataSource;
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'stillwell-lease-'));
    ds = new DataSource({
      type: 'better-sqlite3',
      database: join(dir, 'lease.sqlite'),
      migrations: [JobLeases1765152000000],
      migrationsRun: true,
    });
    await ds.initialize();
  });
  afterAll(async () => {
    await ds.destroy();
    rmSync(dir, { recursive: true, force: true });
  });

  it('gives a job to one gateway at a time, renews it for the holder, and hands it on after expiry', async () => {
    const writes = new WriteQueueService();
    const a = new LeaseService(ds, writes, config('database'));
    const b = new LeaseService(ds, writes, config('database'));
    expect(await a.acquire('sweep', 200)).toBe(true);
    expect(await b.acquire('sweep', 200)).toBe(false);
    expect(await a.acquire('sweep', 200)).toBe(true);
    expect([a.holds('sweep'), b.holds('sweep')]).toEqual([true, false]);
    // another job is free
    expect(await b.acquire('tick', 200)).toBe(true);
    await new Promise((r) => setTimeout(r, 250));
    expect(a.holds('sweep')).toBe(false);
    expect(await b.acquire('sweep', 200)).toBe(true);
    expect(await a.acquire('sweep', 200)).toBe(false);
    // at shutdown the holder lets go: the other takes it without waiting for expiry
    await b.onModuleDestroy();
    expect(await a.acquire('sweep', 60_000)).toBe(true);
  });

  it('always runs alone (local), without touching the database', async () => {
    const local = new LeaseService({} as DataSource, new WriteQueueService(), config('local'));
    expect(await local.acquire('sweep')).toBe(true);
    expect(local.holds('anything')).toBe(true);
  });
});
