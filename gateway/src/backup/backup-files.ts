import { createHash } from 'node:crypto';
import { createReadStream, readdirSync, statSync, unlinkSync } from 'node:fs';
import { join } from 'node:path';

/** stillwell-2026-12-02T16-40-00-123Z.sqlite: sorts by time as text, safe on every filesystem. */
const NAME = /^stillwell-\d{4}-\d{2}-\d{2}T\d{2}-\d{2}-\d{2}-\d{3}Z\.sqlite$/;

export interface BackupFile {
  name: string;
  bytes: number;
  /** ISO 8601, from the name */
  takenAt: string;
}

export function backupName(at: Date): string {
  return `stillwell-${at.toISOString().replace(/[:.]/g, '-')}.sqlite`;
}

export function isBackupName(name: string): boolean {
  return NAME.test(name);
}

function takenAtOf(name: string): string {
  const [, date, h, m, s, ms] = /^stillwell-(.{10})T(\d\d)-(\d\d)-(\d\d)-(\d{3})Z/.exec(name)!;
  return `${date}T${h}:${m}:${s}.${ms}Z`;
}

/** The backups in a folder, newest first; anything else there is left alone. */
export function listBackups(dir: string): BackupFile[] {
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return [];
  }
  return names
    .filter(isBackupName)
    .sort()
    .reverse()
    .map((name) => ({ name, bytes: statSync(join(dir, name)).size, takenAt: takenAtOf(name) }));
}

/** Deletes all but the newest `keep` backups; returns the names deleted. */
export function pruneBackups(dir: string, keep: number): string[] {
  const old = listBackups(dir).slice(keep);
  for (const b of old) unlinkSync(join(dir, b.name));
  return old.map((b) => b.name);
}

export function sha256OfFile(path: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash('sha256');
    createReadStream(path)
      .on('data', (chunk) => hash.update(chunk))
      .on('error', reject)
      .on('end', () => resolve(hash.digest('hex')));
  });
}
