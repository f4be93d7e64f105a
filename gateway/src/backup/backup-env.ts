import { z } from 'zod';

/** Online backups of the SQLite database (docs/reliability.md). */
export const backupEnv = {
  /** minutes between scheduled backups; 0 turns the schedule off (on demand still works) */
  BACKUP_INTERVAL_MIN: z.coerce.number().min(0).max(10_080).default(60),
  /** where backups go; unset: a "backups" folder next to the database */
  BACKUP_DIR: z.string().min(1).optional(),
  /** backups kept; the oldest beyond this are deleted after each new one */
  BACKUP_KEEP: z.coerce.number().int().min(1).max(10_000).default(24),
};
