#!/usr/bin/env node
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { RestoreRefused, restoreBackup } from '../backup/restore-command';
import { envSchema } from '../config';

const USAGE = `Restores the database from a backup (docs/reliability.md).

  node gateway/dist/cli/restore.js BACKUP [--db PATH]

BACKUP is a file from the backup folder (GET /api/backups lists them). PATH defaults to the
gateway's DATABASE_PATH. Stop the gateway first: the restore refuses while the database is open.
The backup must pass SQLite's integrity check and its logbook chain must verify; the database it
replaces is kept beside it as PATH.before-restore-<time>.
`;

async function main(): Promise<void> {
  const { values, positionals } = parseArgs({
    options: { db: { type: 'string' }, help: { type: 'boolean' } },
    allowPositionals: true,
    strict: true,
  });
  if (values.help || positionals.length !== 1) {
    process.stdout.write(USAGE);
    process.exitCode = values.help ? 0 : 2;
    return;
  }
  const databasePath = resolve(
    values.db ?? envSchema.shape.DATABASE_PATH.parse(process.env.DATABASE_PATH),
  );
  const { check, keptAside } = await restoreBackup(resolve(positionals[0]!), databasePath);
  console.log(
    `Restored ${databasePath}: integrity ok, logbook of ${check.logbook.count} entries verifies, ${check.readings} readings.`,
  );
  if (keptAside) console.log(`The database it replaced is kept at ${keptAside}`);
}

main().catch((error: unknown) => {
  console.error(
    error instanceof RestoreRefused ? `Restore refused: ${error.message}` : 'Restore failed:',
    error instanceof RestoreRefused ? '' : error,
  );
  process.exitCode = 1;
});
