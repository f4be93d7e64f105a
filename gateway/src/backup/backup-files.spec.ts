import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { backupName, isBackupName, listBackups, pruneBackups } from './backup-files';

describe('backup files', () => {
  let dir: string;
  beforeEach(() => (dir = mkdtempSync(join(tmpdir(), 'stillwell-backup-files-'))));
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('names a backup by its time, and reads the time back', () => {
    const name = backupName(new Date('2026-12-02T16:40:00.123Z'));
    expect(name).toBe('stillwell-2026-12-02T16-40-00-123Z.sqlite');
    writeFileSync(join(dir, name), 'x');
    expect(listBackups(dir)).toEqual([{ name, bytes: 1, takenAt: '2026-12-02T16:40:00.123Z' }]);
  });

  it('keeps the newest N and leaves files that are not backups alone', () => {
    const names = [1, 2, 3, 4].map((h) => backupName(new Date(Date.UTC(2026, 11, 2, h))));
    for (const n of [...names, 'notes.txt', `${names[0]}.partial`]) writeFileSync(join(dir, n), '');
    expect(pruneBackups(dir, 2)).toEqual([names[1], names[0]]);
    expect(listBackups(dir).map((b) => b.name)).toEqual([names[3], names[2]]);
    expect(isBackupName('notes.txt')).toBe(false);
  });

  it('lists nothing for a folder that does not exist yet', () => {
    expect(listBackups(join(dir, 'missing'))).toEqual([]);
  });
});
