import Database from 'better-sqlite3';
import { GENESIS_HASH, verifyEntries, type ChainVerdict } from '@stillwell/shared/logbook';

export interface DatabaseCheck {
  /** PRAGMA integrity_check said "ok" */
  intact: boolean;
  integrity: string[];
  logbook: ChainVerdict;
  readings: number;
}

interface EntryRow {
  seq: number;
  time: string;
  actor_id: string | null;
  actor_name: string | null;
  actor_roles: string;
  kind: string;
  payload: string;
  prev_hash: string;
  hash: string;
}

const PAGE = 1000;

/**
 * Checks a database file without changing it: SQLite's own integrity check, then the logbook's
 * hash chain end to end. What a restore requires of a backup before it replaces anything.
 */
export async function checkDatabase(path: string): Promise<DatabaseCheck> {
  const db = new Database(path, { readonly: true, fileMustExist: true });
  try {
    const integrity = (db.pragma('integrity_check') as Array<{ integrity_check: string }>).map(
      (r) => r.integrity_check,
    );
    const intact = integrity.length === 1 && integrity[0] === 'ok';
    const page = db.prepare('SELECT * FROM logbook_entries WHERE seq > ? ORDER BY seq ASC LIMIT ?');
    let previous = { seq: 0, hash: GENESIS_HASH };
    let logbook: ChainVerdict = { ok: true, count: 0, headSeq: null, headHash: null };
    let count = 0;
    for (;;) {
      const rows = page.all(previous.seq, PAGE) as EntryRow[];
      if (!rows.length) break;
      const verdict = await verifyEntries(
        rows.map((r) => ({
          seq: r.seq,
          time: r.time,
          actorId: r.actor_id,
          actorName: r.actor_name,
          actorRoles: JSON.parse(r.actor_roles) as string[],
          kind: r.kind,
          payload: JSON.parse(r.payload) as Record<string, unknown>,
          prevHash: r.prev_hash,
          hash: r.hash,
        })),
        previous,
      );
      count += verdict.count;
      logbook = { ...verdict, count };
      if (!verdict.ok || verdict.headSeq === null || verdict.headHash === null) break;
      previous = { seq: verdict.headSeq, hash: verdict.headHash };
    }
    const { n } = db.prepare('SELECT COUNT(*) AS n FROM readings').get() as { n: number };
    return { intact, integrity: integrity.slice(0, 10), logbook, readings: n };
  } finally {
    db.close();
  }
}
