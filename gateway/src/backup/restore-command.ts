import { copyFileSync, existsSync, mkdirSync, renameSync, rmSync } from 'node:fs';
import { dirname } from 'node:path';
import Database from 'better-sqlite3';
import { checkDatabase, type DatabaseCheck } from './database-check';

export class RestoreRefused extends Error {}

/**
 * Is another connection (a running gateway) holding the database? An exclusive lock cannot be had
 * while one is open in WAL mode, even an idle one, so this asks for one and lets go at once.
 */
export function databaseInUse(path: string): boolean {
  if (!existsSync(path)) return false;
  const db = new Database(path, { fileMustExist: true, timeout: 0 });
  try {
    db.pragma('locking_mode = EXCLUSIVE');
    db.exec('BEGIN EXCLUSIVE');
    db.exec('COMMIT');
    return false;
  } catch (error) {
    if ((error as { code?: string }).code?.startsWith('SQLITE_BUSY')) return true;
    throw error;
  } finally {
    db.close();
  }
}

export interface RestoreResult {
  check: DatabaseCheck;
  /** where the database that was replaced now is; null when there was none */
  keptAside: string | null;
}

/**
 * Replaces the database with a backup: refused while the gateway holds the database, refused for
 * a backup that fails SQLite's integrity check or whose logbook chain does not verify. The old
 * file (with its WAL) is kept aside, never deleted.
 */
export async function restoreBackup(
  backupPath: string,
  databasePath: string,
  now = new Date(),
): Promise<RestoreResult> {
  if (!existsSync(backupPath)) throw new RestoreRefused(`backup: no file at ${backupPath}`);
  if (databaseInUse(databasePath)) {
    throw new RestoreRefused(
      `database ${databasePath} is in use (is the gateway running?): stop it first`,
    );
  }
  const check = await checkDatabase(backupPath);
  if (!check.intact) {
    throw new RestoreRefused(`backup fails the integrity check: ${check.integrity.join('; ')}`);
  }
  if (!check.logbook.ok) {
    const bad = check.logbook.firstBad;
    throw new RestoreRefused(
      `backup's logbook does not verify at entry ${bad?.seq}: ${bad?.problem} (${bad?.detail})`,
    );
  }
  let keptAside: string | null = null;
  if (existsSync(databasePath)) {
    keptAside = `${databasePath}.before-restore-${now.toISOString().replace(/[:.]/g, '-')}`;
    // the WAL and its index belong to the old file: moved with it, so it opens whole from there
    for (const suffix of ['', '-wal', '-shm']) {
      if (existsSync(databasePath + suffix)) renameSync(databasePath + suffix, keptAside + suffix);
    }
  }
  mkdirSync(dirname(databasePath), { recursive: true });
  const partial = `${databasePath}.restoring`;
  copyFileSync(backupPath, partial);
  rmSync(`${databasePath}-wal`, { force: true });
  rmSync(`${databasePath}-shm`, { force: true });
  renameSync(partial, databasePath);
  return { check, keptAside };
}
