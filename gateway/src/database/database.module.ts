import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { Global, Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { TypeOrmModule, type TypeOrmModuleOptions } from '@nestjs/typeorm';
import type Database from 'better-sqlite3';
import { DataSource } from 'typeorm';
import type { Env } from '../config';
import { LeaseService } from './lease.service';
import { WriteQueueService } from './write-queue.service';
import { MIGRATIONS } from './migrations';
import { portableMigration } from './postgres/portable-ddl';
import { preparePostgres } from './postgres/postgres-driver';

/** Several gateways on one PostgreSQL: the same entities and migrations, made portable. */
function postgresOptions(url: string, poolSize: number): TypeOrmModuleOptions {
  return {
    type: 'postgres',
    url,
    poolSize,
    autoLoadEntities: true,
    synchronize: false,
    migrations: MIGRATIONS.map(portableMigration),
    migrationsRun: true,
  };
}

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
        const url = config.get('DATABASE_URL', { infer: true });
        if (url) return postgresOptions(url, config.get('DATABASE_POOL_SIZE', { infer: true }));
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
      // PostgreSQL answers with numbers and takes `?` placeholders, as SQLite does
      dataSourceFactory: async (options) => {
        const dataSource = new DataSource(options!);
        if (options!.type === 'postgres') preparePostgres(dataSource);
        return dataSource.initialize();
      },
    }),
  ],
  providers: [WriteQueueService, LeaseService],
  exports: [WriteQueueService, LeaseService],
})
export class DatabaseModule {}
