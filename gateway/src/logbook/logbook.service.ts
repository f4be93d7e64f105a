import { Injectable, Logger, OnApplicationBootstrap, OnModuleDestroy } from '@nestjs/common';
import { Subject } from 'rxjs';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import { canonicalize } from 'json-canonicalize';
import {
  attachmentRefSchema,
  GENESIS_HASH,
  hashEntry,
  verifyEntries,
  type LogbookEntry,
  type LogbookHead,
  type VerificationReport,
} from '@stillwell/shared/logbook';
import { WriteQueueService } from '../database/write-queue.service';
import { AttachmentStore } from './attachment-store.service';
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

/** The attachments an entry's payload names (a list of AttachmentRef under `attachments`). */
export function attachmentsOf(
  e: LogbookEntry,
): Array<{ seq: number; sha256: string; size: number }> {
  const list = e.payload.attachments;
  if (!Array.isArray(list)) return [];
  return list.flatMap((a) => {
    const ref = attachmentRefSchema.safeParse(a);
    return ref.success ? [{ seq: e.seq, sha256: ref.data.sha256, size: ref.data.size }] : [];
  });
}

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
 * `committed$` tells of each entry once its transaction has committed (the live feed).
 */
@Injectable()
export class LogbookService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(LogbookService.name);
  readonly committed$ = new Subject<LogbookEntry>();
  private published = 0;
  private publishQueued = false;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly attachments: AttachmentStore,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    this.published = Math.max(this.published, (await this.head()).seq ?? 0);
  }

  onModuleDestroy(): void {
    this.committed$.complete();
  }

  /**
   * Appends one entry. With `manager` the caller is inside `writes.run(...)` and a transaction
   * already; without, the entry is queued and written on its own.
   */
  append(entry: NewLogbookEntry, manager?: EntityManager): Promise<{ seq: number; hash: string }> {
    const written = manager
      ? this.appendWith(manager, entry)
      : this.writes.run(() => this.dataSource.transaction((tx) => this.appendWith(tx, entry)));
    this.publishAfterCommit();
    return written;
  }

  /**
   * The write queue runs one job at a time, so a job queued now runs after the caller's
   * transaction has committed (or rolled back). It then reads what is really there: an entry
   * rolled back is never announced.
   */
  private publishAfterCommit(): void {
    if (this.publishQueued) return;
    this.publishQueued = true;
    void this.writes
      .run(async () => {
        this.publishQueued = false;
        for (;;) {
          const fresh = await this.after(this.published, 200);
          if (!fresh.length) break;
          for (const e of fresh) this.committed$.next(e);
          this.published = fresh[fresh.length - 1]!.seq;
        }
      })
      .catch((error: unknown) => this.logger.error(`Live feed: ${String(error)}`));
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
    const refs: Array<{ seq: number; sha256: string; size: number }> = [];
    for (;;) {
      const rows = await repo
        .createQueryBuilder('e')
        .where('e.seq > :seq', { seq: previous.seq })
        .orderBy('e.seq', 'ASC')
        .limit(VERIFY_PAGE)
        .getMany();
      if (!rows.length) break;
      const entries = rows.map(toEntry);
      for (const e of entries) refs.push(...attachmentsOf(e));
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
    const attachments = await this.checkAttachments(refs);
    return this.report({
      ok: attachments.bad.length === 0,
      count,
      headSeq: previous.seq || null,
      headHash: previous.seq ? previous.hash : null,
      attachments,
    });
  }

  /** Rehashes every attachment the entries name: bytes changed on disk are found here. */
  private async checkAttachments(
    refs: ReadonlyArray<{ seq: number; sha256: string; size: number }>,
  ): Promise<NonNullable<VerificationReport['attachments']>> {
    const bad: NonNullable<VerificationReport['attachments']>['bad'] = [];
    for (const ref of refs) {
      const verdict = await this.attachments.verify(ref);
      if (verdict === 'ok') continue;
      bad.push({
        seq: ref.seq,
        sha256: ref.sha256,
        problem: verdict,
        detail:
          verdict === 'missing'
            ? `entry ${ref.seq}: attachment ${ref.sha256} is missing from the attachments directory`
            : `entry ${ref.seq}: attachment ${ref.sha256} no longer hashes to its recorded SHA-256 (its bytes were changed)`,
      });
    }
    return { checked: refs.length, bad };
  }

  private report(r: Omit<VerificationReport, 'checkedAt'>): VerificationReport {
    if (!r.ok)
      this.logger.error(
        `Logbook verification failed: ${r.firstBad?.detail ?? r.attachments?.bad[0]?.detail}`,
      );
    return { ...r, checkedAt: new Date().toISOString() };
  }
}
