import { canonicalize } from 'json-canonicalize';

/** The previous-hash of the first entry. */
export const GENESIS_HASH = '0'.repeat(64);

/** What an entry's hash covers: everything but the hash itself. */
export interface LogbookEntryBody {
  seq: number;
  /** ISO 8601 UTC with milliseconds, as stored */
  time: string;
  actorId: string | null;
  actorName: string | null;
  actorRoles: string[];
  kind: string;
  payload: Record<string, unknown>;
  prevHash: string;
}

export interface LogbookEntryRecord extends LogbookEntryBody {
  hash: string;
}

/** RFC 8785 JSON Canonicalization Scheme form of an entry body: the exact bytes that are hashed. */
export function canonicalEntry(body: LogbookEntryBody): string {
  const { seq, time, actorId, actorName, actorRoles, kind, payload, prevHash } = body;
  return canonicalize({ seq, time, actorId, actorName, actorRoles, kind, payload, prevHash });
}

const hex = (buffer: ArrayBuffer) =>
  Array.from(new Uint8Array(buffer), (b) => b.toString(16).padStart(2, '0')).join('');

/** SHA-256 (WebCrypto, present in Node and in browsers) of a UTF-8 string, lower-case hex. */
export async function sha256Hex(text: string): Promise<string> {
  return hex(await globalThis.crypto.subtle.digest('SHA-256', new TextEncoder().encode(text)));
}

export function hashEntry(body: LogbookEntryBody): Promise<string> {
  return sha256Hex(canonicalEntry(body));
}

export type ChainProblem = 'hash-mismatch' | 'broken-link' | 'missing-entries' | 'head-mismatch';

export interface ChainVerdict {
  ok: boolean;
  /** entries checked */
  count: number;
  headSeq: number | null;
  headHash: string | null;
  /** the first entry that does not match, and why */
  firstBad?: { seq: number; problem: ChainProblem; detail: string };
}

/**
 * Checks entries in sequence order, continuing from `previous` (the entry before the first one
 * given, or the genesis). Call it page by page with the returned head to verify a long chain.
 */
export async function verifyEntries(
  entries: readonly LogbookEntryRecord[],
  previous: { seq: number; hash: string } = { seq: 0, hash: GENESIS_HASH },
): Promise<ChainVerdict> {
  let prev = previous;
  let count = 0;
  for (const entry of entries) {
    const bad = (problem: ChainProblem, detail: string): ChainVerdict => ({
      ok: false,
      count,
      headSeq: prev.seq || null,
      headHash: prev.seq ? prev.hash : null,
      firstBad: { seq: entry.seq, problem, detail },
    });
    if (entry.seq !== prev.seq + 1) {
      return bad(
        'missing-entries',
        `entry ${entry.seq} follows entry ${prev.seq}: ${entry.seq - prev.seq - 1} entries are missing`,
      );
    }
    if (entry.prevHash !== prev.hash) {
      return bad(
        'broken-link',
        `entry ${entry.seq} names ${entry.prevHash} as the previous hash, not ${prev.hash}`,
      );
    }
    const actual = await hashEntry(entry);
    if (actual !== entry.hash) {
      return bad(
        'hash-mismatch',
        `entry ${entry.seq} hashes to ${actual}, but records ${entry.hash}`,
      );
    }
    prev = { seq: entry.seq, hash: entry.hash };
    count += 1;
  }
  return { ok: true, count, headSeq: prev.seq || null, headHash: prev.seq ? prev.hash : null };
}
