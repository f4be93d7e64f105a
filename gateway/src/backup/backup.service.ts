import { mkdirSync, renameSync, rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import {
  ConflictException,
  Injectable,
  Logger,
  OnApplicationBootstrap,
  OnModuleDestroy,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { SchedulerRegistry } from '@nestjs/schedule';
import type Database from 'better-sqlite3';
import { DataSource } from 'typeorm';
import type { Env } from '../config';
import { LogbookService, type LogbookActor } from '../logbook/logbook.service';
import {
  backupName,
  listBackups,
  pruneBackups,
  sha256OfFile,
  type BackupFile,
} from './backup-files';

export interface TakenBackup extends BackupFile {
  sha256: string;
}

const JOB = 'database-backup';

/**
 * Online backups of the SQLite database with better-sqlite3's backup API: a consistent copy taken
 * page by page while the gateway goes on writing (its own writes during the copy are included).
 * On a schedule and on demand; the newest BACKUP_KEEP are kept. PostgreSQL has its own tools.
 */
@Injectable()
export class BackupService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(BackupService.name);
  readonly dir: string;
  private readonly keep: number;
  private readonly intervalMin: number;
  private readonly sqlite: boolean;
  private last: Promise<unknown> = Promise.resolve();

  constructor(
    private readonly dataSource: DataSource,
    private readonly logbook: LogbookService,
    private readonly scheduler: SchedulerRegistry,
    config: ConfigService<Env, true>,
  ) {
    const database = config.get('DATABASE_PATH', { infer: true });
    this.sqlite = !config.get('DATABASE_URL', { infer: true }) && database !== ':memory:';
    this.dir = config.get('BACKUP_DIR', { infer: true }) ?? join(dirname(database), 'backups');
    this.keep = config.get('BACKUP_KEEP', { infer: true });
    this.intervalMin = config.get('BACKUP_INTERVAL_MIN', { infer: true });
  }

  onApplicationBootstrap(): void {
    if (!this.sqlite || this.intervalMin === 0) return;
    const timer = setInterval(() => {
      this.take().catch((error: Error) =>
        this.logger.error(`Scheduled backup failed: ${error.message}`),
      );
    }, this.intervalMin * 60_000);
    this.scheduler.addInterval(JOB, timer);
  }

  onModuleDestroy(): void {
    if (this.scheduler.doesExist('interval', JOB)) this.scheduler.deleteInterval(JOB);
  }

  list(): BackupFile[] {
    return listBackups(this.dir);
  }

  /** Takes a backup now; one at a time. With an actor, the logbook records it. */
  take(actor?: LogbookActor): Promise<TakenBackup> {
    if (!this.sqlite) {
      return Promise.reject(
        new ConflictException('online backup is for SQLite; back PostgreSQL up with its own tools'),
      );
    }
    const run = async () => {
      const taken = await this.copy();
      if (actor) {
        await this.logbook.append({
          kind: 'database.backup',
          actor,
          payload: { name: taken.name, bytes: taken.bytes, sha256: taken.sha256 },
        });
      }
      const pruned = pruneBackups(this.dir, this.keep);
      this.logger.log(
        `Backup ${taken.name} (${taken.bytes} bytes)${pruned.length ? `; removed ${pruned.join(', ')}` : ''}`,
      );
      return taken;
    };
    const next = this.last.then(run, run);
    this.last = next.catch(() => undefined);
    return next;
  }

  private async copy(): Promise<TakenBackup> {
    mkdirSync(this.dir, { recursive: true });
    const name = backupName(new Date());
    const path = join(this.dir, name);
    // copied under another name first: a half-written file is never listed as a backup
    const partial = `${path}.partial`;
    try {
      await this.connection().backup(partial);
      renameSync(partial, path);
    } catch (error) {
      rmSync(partial, { force: true });
      throw error;
    }
    const [file] = listBackups(this.dir).filter((b) => b.name === name);
    return { ...file!, sha256: await sha256OfFile(path) };
  }

  /** TypeORM's one better-sqlite3 connection: its backup sees the gateway's own writes. */
  private connection(): Database.Database {
    return (this.dataSource.driver as unknown as { databaseConnection: Database.Database })
      .databaseConnection;
  }
}
