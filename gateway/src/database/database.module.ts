import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { Global, Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import type Database from 'better-sqlite3';
import type { Env } from '../config';
import { WriteQueueService } from './write-queue.service';
import { MIGRATIONS } from './migrations';

/** Pragmas applied to every connection. FULL sync: the logbook and stored readings must survive power loss. */
export function prepareSqlite(db: Database.Database): void {
  db.pragma('journal_mode = WAL');
  db.pragma('synchronous = FULL');
  db.pragma('foreign_keys = ON');
  db.pragma('busy_timeout = 5000');
}

@Global()
@Module({
  imports: [
    TypeOrmModule.forRootAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService<Env, true>) => {
        const database = config.get('DATABASE_PATH', { infer: true });
        if (database !== ':memory:') mkdirSync(dirname(database), { recursive: true });
        return {
          type: 'better-sqlite3' as const,
          database,
          prepareDatabase: prepareSqlite,
          autoLoadEntities: true,
          synchronize: false,
          migrations: MIGRATIONS,
          migrationsRun: true,
        };
      },
    }),
  ],
  providers: [WriteQueueService],
  exports: [WriteQueueService],
})
export class DatabaseModule {}
