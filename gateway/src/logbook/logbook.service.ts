import { Injectable, Logger } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import { canonicalize } from 'json-canonicalize';
import {
  GENESIS_HASH,
  hashEntry,
  verifyEntries,
  type LogbookEntry,
  type LogbookHead,
  type VerificationReport,
} from '@stillwell/shared/logbook';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookEntryRow } from './logbook-entry.entity';

export interface LogbookActor {
  userId: string;
  username: string;
  roles: string[];
}

export interface NewLogbookEntry {
  kind: string;
  actor: LogbookActor | null;
  payload: Record<string, unknown>;
}

const VERIFY_PAGE = 1000;

export function toEntry(row: LogbookEntryRow): LogbookEntry {
  return {
    seq: row.seq,
    time: row.time,
    actorId: row.actorId,
    actorName: row.actorName,
    actorRoles: JSON.parse(row.actorRoles) as string[],
    kind: row.kind,
    payload: JSON.parse(row.payload) as Record<string, unknown>,
    prevHash: row.prevHash,
    hash: row.hash,
  };
}

/**
 * The only writer of the logbook chain. An entry is written in the same transaction as the change
 * it records when the caller passes its EntityManager; otherwise in a transaction of its own.
 */
@Injectable()
export class LogbookService {
  private readonly logger = new Logger(LogbookService.name);

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
  ) {}

  /**
   * Appends one entry. With `manager` the caller is inside `writes.run(...)` and a transaction
   * already; without, the entry is queued and written on its own.
   */
  append(entry: NewLogbookEntry, manager?: EntityManager): Promise<{ seq: number; hash: string }> {
    if (manager) return this.appendWith(manager, entry);
    return this.writes.run(() => this.dataSource.transaction((tx) => this.appendWith(tx, entry)));
  }

  private async appendWith(
    tx: EntityManager,
    entry: NewLogbookEntry,
  ): Promise<{ seq: number; hash: string }> {
    const last = await tx.findOne(LogbookEntryRow, { where: {}, order: { seq: 'DESC' } });
    // Round-trip the payload through canonical JSON so what is stored is what is hashed
    // (undefined fields dropped, numbers in their canonical form).
    const payload = JSON.parse(canonicalize(entry.payload)) as Record<string, unknown>;
    const body = {
      seq: (last?.seq ?? 0) + 1,
      time: new Date().toISOString(),
      actorId: entry.actor?.userId ?? null,
      actorName: entry.actor?.username ?? null,
      actorRoles: entry.actor?.roles ?? [],
      kind: entry.kind,
      payload,
      prevHash: last?.hash ?? GENESIS_HASH,
    };
    const hash = await hashEntry(body);
    await tx.insert(LogbookEntryRow, {
      ...body,
      actorRoles: JSON.stringify(body.actorRoles),
      payload: canonicalize(payload),
      hash,
    });
    return { seq: body.seq, hash };
  }

  async head(): Promise<LogbookHead> {
    const last = await this.dataSource
      .getRepository(LogbookEntryRow)
      .findOne({ where: {}, order: { seq: 'DESC' } });
    return { seq: last?.seq ?? null, hash: last?.hash ?? null, time: last?.time ?? null };
  }

  /** Entries after a sequence number, oldest first (the live feed and replay read this). */
  async after(seq: number, limit = 500): Promise<LogbookEntry[]> {
    const rows = await this.dataSource
      .getRepository(LogbookEntryRow)
      .createQueryBuilder('e')
      .where('e.seq > :seq', { seq })
      .orderBy('e.seq', 'ASC')
      .limit(limit)
      .getMany();
    return rows.map(toEntry);
  }

  /**
   * Recomputes the whole chain, page by page. With a published head (seq and hash) it also proves
   * that the entry at that seq is still the one that was published.
   */
  async verify(published?: { seq: number; hash: string }): Promise<VerificationReport> {
    const repo = this.dataSource.getRepository(LogbookEntryRow);
    let previous = { seq: 0, hash: GENESIS_HASH };
    let count = 0;
    let publishedSeen = false;
    for (;;) {
      const rows = await repo
        .createQueryBuilder('e')
        .where('e.seq > :seq', { seq: previous.seq })
        .orderBy('e.seq', 'ASC')
        .limit(VERIFY_PAGE)
        .getMany();
      if (!rows.length) break;
      const entries = rows.map(toEntry);
      const verdict = await verifyEntries(entries, previous);
      count += verdict.count;
      if (published && !publishedSeen) {
        const match = entries.find((e) => e.seq === published.seq);
        if (match) {
          publishedSeen = true;
          if (match.hash !== published.hash) {
            return this.report({
              ok: false,
              count,
              headSeq: verdict.headSeq,
              headHash: verdict.headHash,
              firstBad: {
                seq: published.seq,
                problem: 'head-mismatch',
                detail: `entry ${published.seq} now has hash ${match.hash}, not the published ${published.hash}`,
              },
            });
          }
        }
      }
      if (!verdict.ok) return this.report({ ...verdict, count });
      previous = { seq: verdict.headSeq!, hash: verdict.headHash! };
    }
    if (published && !publishedSeen) {
      return this.report({
        ok: false,
        count,
        headSeq: previous.seq || null,
        headHash: previous.seq ? previous.hash : null,
        firstBad: {
          seq: published.seq,
          problem: 'head-mismatch',
          detail: `the published entry ${published.seq} is no longer in the logbook (it ends at ${previous.seq})`,
        },
      });
    }
    return this.report({
      ok: true,
      count,
      headSeq: previous.seq || null,
      headHash: previous.seq ? previous.hash : null,
    });
  }

  private report(r: Omit<VerificationReport, 'checkedAt'>): VerificationReport {
    if (!r.ok) this.logger.error(`Logbook verification failed: ${r.firstBad?.detail}`);
    return { ...r, checkedAt: new Date().toISOString() };
  }
}
