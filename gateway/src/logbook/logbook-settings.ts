import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import type { ConfigService } from '@nestjs/config';

/** ATTACHMENTS_DIR: where attachments are kept; by default `attachments/` beside the database. */
export function attachmentsDir(config: ConfigService): string {
  const given = config.get<string>('ATTACHMENTS_DIR');
  if (given) return resolve(given);
  const database = config.get<string>('DATABASE_PATH') ?? ':memory:';
  return database === ':memory:'
    ? join(tmpdir(), 'stillwell-attachments')
    : join(dirname(resolve(database)), 'attachments');
}
