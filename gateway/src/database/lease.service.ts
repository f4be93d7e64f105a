import { randomUUID } from 'node:crypto';
import { hostname } from 'node:os';
import { Injectable, type OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { Env } from '../config';
import { WriteQueueService } from './write-queue.service';

/** A lease outlives a few missed renewals, and a dead holder's job moves on within this. */
export const LEASE_TTL_MS = 15_000;

/**
 * Scheduled jobs run once across gateways: before each round a job takes (or renews) its lease, a
 * row with a holder and an expiry, in one conditional upsert. Alone on SQLite there is nobody to
 * share with (JOB_LEASES=local, the default then) and every round runs. Leases compare wall
 * clocks, so the gateways keep them in step (NTP; common practice) well inside LEASE_TTL_MS.
 */
@Injectable()
export class LeaseService implements OnModuleDestroy {
  readonly holder = `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`;
  private readonly shared: boolean;
  private readonly held = new Map<string, number>();

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    config: ConfigService<Env, true>,
  ) {
    const mode =
      config.get('JOB_LEASES', { infer: true }) ??
      (config.get('DATABASE_URL', { infer: true }) ? 'database' : 'local');
    this.shared = mode === 'database';
  }

  /** Takes or renews the job's lease; false while another gateway holds it. Never throws. */
  async acquire(job: string, ttlMs = LEASE_TTL_MS): Promise<boolean> {
    if (!this.shared) return true;
    const now = Date.now();
    const take = () =>
      this.dataSource.query(
        `INSERT INTO "job_leases" ("job", "holder", "expires_at") VALUES (?, ?, ?)
         ON CONFLICT ("job") DO UPDATE SET "holder" = excluded."holder", "expires_at" = excluded."expires_at"
         WHERE "job_leases"."holder" = excluded."holder" OR "job_leases"."expires_at" < ?
         RETURNING "holder"`,
        [job, this.holder, now + ttlMs, now],
      ) as Promise<Array<{ holder: string }>>;
    try {
      // SQLite has one connection: its writes go through the one queue
      const rows =
        this.dataSource.options.type === 'postgres' ? await take() : await this.writes.run(take);
      const mine = rows.length > 0;
      if (mine) this.held.set(job, now + ttlMs);
      else this.held.delete(job);
      return mine;
    } catch {
      // the database is away: nobody can prove they hold it, so nobody runs the round
      this.held.delete(job);
      return false;
    }
  }

  /** Whether this gateway held the job's lease at its last renewal and it has not run out. */
  holds(job: string): boolean {
    return !this.shared || (this.held.get(job) ?? 0) > Date.now();
  }

  /** Gives the leases up at shutdown, so another gateway takes the jobs at once. */
  async onModuleDestroy(): Promise<void> {
    if (!this.shared) return;
    for (const job of [...this.held.keys()]) {
      this.held.delete(job);
      await this.dataSource
        .query(`DELETE FROM "job_leases" WHERE "job" = ? AND "holder" = ?`, [job, this.holder])
        .catch(() => undefined);
    }
  }
}
