import { Injectable, Logger, OnApplicationBootstrap, OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectRepository } from '@nestjs/typeorm';
import type { Subscription } from 'rxjs';
import { Repository } from 'typeorm';
import {
  BACKFILL_REPLY_SUBSCRIPTION,
  backfillReplySchema,
  backfillTopic,
  describeIssues,
  parseTopic,
  type BackfillReply,
  type BackfillRequest,
} from '@stillwell/shared/telemetry';
import type { Env } from '../config';
import { WriteQueueService } from '../database/write-queue.service';
import { MqttService } from '../mqtt/mqtt.service';
import { judgeGap, nextPart, type UnavailableRun } from './gap-outcome';
import { IngestionService } from './ingestion.service';
import { SequenceGap } from './sequence-gap.entity';

/** Gaps chased at once; the others wait for the next round (each is a row in sequence_gaps). */
const MAX_CHASES = 50;

interface Chase {
  gap: SequenceGap;
  /** first sequence number not yet asked for in this round */
  cursor: number;
  /** requests for the current part, or re-checks of the whole gap once all parts are asked */
  tries: number;
  rounds: number;
  runs: UnavailableRun[];
  requestId?: string;
  timer?: NodeJS.Timeout;
}

export interface BackfillCounters {
  requests: number;
  replies: number;
  badReplies: number;
  filled: number;
  unavailable: number;
  unanswered: number;
}

/**
 * Asks a device to send again the readings of a sequence gap (QoS 1, on its backfill topic), in
 * bounded parts, a bounded number of times, and records in the gap's row what came of it. The
 * readings sent again arrive as ordinary telemetry and are stored idempotently by ingestion; this
 * service only counts them in the database. Open gaps left by an earlier run are taken up at start.
 */
@Injectable()
export class BackfillService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(BackfillService.name);
  private readonly chases = new Map<number, Chase>();
  private readonly byRequest = new Map<string, Chase>();
  private readonly maxSeqs: number;
  private readonly attempts: number;
  private readonly retryMs: number;
  private subscription?: Subscription;
  private closed = false;
  private resuming?: Promise<void>;
  readonly counters: BackfillCounters = {
    requests: 0,
    replies: 0,
    badReplies: 0,
    filled: 0,
    unavailable: 0,
    unanswered: 0,
  };

  constructor(
    @InjectRepository(SequenceGap) private readonly gaps: Repository<SequenceGap>,
    private readonly mqtt: MqttService,
    private readonly ingestion: IngestionService,
    private readonly writes: WriteQueueService,
    config: ConfigService<Env, true>,
  ) {
    this.maxSeqs = config.get('BACKFILL_MAX_SEQS', { infer: true });
    this.attempts = config.get('BACKFILL_ATTEMPTS', { infer: true });
    this.retryMs = config.get('BACKFILL_RETRY_MS', { infer: true });
  }

  async onApplicationBootstrap(): Promise<void> {
    this.mqtt.subscribe(BACKFILL_REPLY_SUBSCRIPTION, (topic, payload) =>
      this.onReply(topic, payload),
    );
    this.subscription = this.ingestion.gapsStored$.subscribe(() => void this.resume());
    await this.resume();
  }

  onModuleDestroy(): void {
    this.closed = true;
    this.subscription?.unsubscribe();
    for (const c of this.chases.values()) clearTimeout(c.timer);
    this.chases.clear();
    this.byRequest.clear();
  }

  /** Takes up every open gap not chased yet. One scan at a time; a call during one runs after it. */
  resume(): Promise<void> {
    const run = async () => {
      if (this.closed || this.chases.size >= MAX_CHASES) return;
      const open = await this.gaps.find({
        where: { state: 'open' },
        order: { id: 'ASC' },
        take: MAX_CHASES,
      });
      for (const gap of open) {
        if (this.closed || this.chases.size >= MAX_CHASES) break;
        if (this.chases.has(gap.id)) continue;
        const chase: Chase = { gap, cursor: gap.fromSeq, tries: 0, rounds: 0, runs: [] };
        this.chases.set(gap.id, chase);
        // in a shared group a "gap" is mostly the share another gateway stored: look before asking
        if (this.mqtt.sharedGroup) this.arm(chase, () => this.onSilence(chase));
        else this.ask(chase);
      }
    };
    const next = (this.resuming ?? Promise.resolve()).then(run, run);
    this.resuming = next.catch((error: Error) => {
      this.logger.error(`Taking up open gaps failed: ${error.message}`);
    });
    return this.resuming;
  }

  private ask(chase: Chase): void {
    if (this.closed) return;
    const { gap } = chase;
    const part = nextPart(chase.cursor, gap.toSeq, this.maxSeqs);
    chase.tries += 1;
    gap.attempts += 1;
    const requestId = `gap-${gap.id}-${part.fromSeq}-${gap.attempts}`;
    if (chase.requestId) this.byRequest.delete(chase.requestId);
    chase.requestId = requestId;
    this.byRequest.set(requestId, chase);
    const request: BackfillRequest = { requestId, ...part };
    this.counters.requests += 1;
    // mqtt.js keeps a QoS 1 publish while offline and sends it on reconnect
    this.mqtt
      .publish(backfillTopic(gap.reservoirId, gap.deviceId), JSON.stringify(request))
      .catch((error: Error) => this.logger.warn(`Backfill request ${requestId}: ${error.message}`));
    this.arm(chase, () => this.onSilence(chase));
  }

  private arm(chase: Chase, then: () => Promise<void> | void): void {
    clearTimeout(chase.timer);
    chase.timer = setTimeout(() => {
      void Promise.resolve(then()).catch((error: Error) =>
        this.logger.error(`Backfill of gap ${chase.gap.id} failed: ${error.stack}`),
      );
    }, this.retryMs);
  }

  /** A reply from a device; anything malformed is counted and logged, never thrown. */
  onReply(topic: string, payload: Buffer): void {
    const parsed = parseTopic(topic);
    let reply: BackfillReply;
    try {
      const result = backfillReplySchema.safeParse(JSON.parse(payload.toString('utf8')));
      if (!result.success) throw new Error(describeIssues(result.error));
      reply = result.data;
    } catch (error) {
      this.counters.badReplies += 1;
      this.logger.warn(`Ignored a bad backfill reply on ${topic}: ${(error as Error).message}`);
      return;
    }
    this.counters.replies += 1;
    const chase = this.byRequest.get(reply.requestId);
    // another gateway's request, or one already answered: the readings are stored all the same
    if (!chase || chase.requestId !== reply.requestId) return;
    if (parsed?.deviceId !== chase.gap.deviceId || parsed.reservoirId !== chase.gap.reservoirId) {
      this.counters.badReplies += 1;
      this.logger.warn(`Backfill reply ${reply.requestId} came from the wrong device (${topic})`);
      return;
    }
    this.byRequest.delete(reply.requestId);
    chase.requestId = undefined;
    chase.runs.push(...reply.unavailable);
    void this.advance(chase, reply.toSeq + 1).catch((error: Error) =>
      this.logger.error(`Backfill of gap ${chase.gap.id} failed: ${error.stack}`),
    );
  }

  /** No answer in time: maybe the readings came anyway (a broker redelivery); else ask again. */
  private async onSilence(chase: Chase): Promise<void> {
    if (this.closed) return;
    // a broker that is down is not the device's silence: wait for it without using up a try
    if (!this.mqtt.connected) return this.arm(chase, () => this.onSilence(chase));
    const part = nextPart(chase.cursor, chase.gap.toSeq, this.maxSeqs);
    if ((await this.storedIn(chase.gap, part.fromSeq, part.toSeq)) === size(part)) {
      return this.advance(chase, part.toSeq + 1);
    }
    if (chase.tries >= this.attempts) return this.settle(chase, true);
    this.ask(chase);
  }

  private async advance(chase: Chase, cursor: number): Promise<void> {
    clearTimeout(chase.timer);
    chase.cursor = cursor;
    chase.tries = 0;
    if (chase.cursor <= chase.gap.toSeq) return this.ask(chase);
    await this.settle(chase, false);
  }

  /** Every part asked for: judge the gap, or look again shortly (readings may be on their way). */
  private async settle(chase: Chase, final: boolean): Promise<void> {
    if (this.closed) return;
    const { gap } = chase;
    const stored = await this.storedIn(gap, gap.fromSeq, gap.toSeq);
    const verdict = judgeGap(gap, stored, chase.runs, final || chase.rounds >= this.attempts);
    if (!verdict) {
      chase.rounds += 1;
      return this.arm(chase, async () => {
        const now = await this.storedIn(gap, gap.fromSeq, gap.toSeq);
        if (judgeGap(gap, now, chase.runs, false)) return this.settle(chase, false);
        // still short: ask for the whole gap again; the device resends only what it holds
        chase.cursor = gap.fromSeq;
        chase.tries = 0;
        chase.runs = [];
        this.ask(chase);
      });
    }
    clearTimeout(chase.timer);
    this.chases.delete(gap.id);
    if (chase.requestId) this.byRequest.delete(chase.requestId);
    this.counters[verdict.state] += 1;
    if (verdict.state !== 'filled')
      this.logger.warn(`Gap ${gap.deviceId} ${gap.fromSeq}-${gap.toSeq}: ${verdict.detail}`);
    await this.writes.run(() =>
      this.gaps.update(
        { id: gap.id },
        {
          state: verdict.state,
          detail: verdict.detail,
          attempts: gap.attempts,
          resolvedAt: Date.now(),
        },
      ),
    );
    void this.resume();
  }

  /** Distinct sequence numbers of the range stored, after what ingestion holds is written. */
  private async storedIn(gap: SequenceGap, fromSeq: number, toSeq: number): Promise<number> {
    await this.ingestion.flush();
    const [row] = (await this.gaps.query(
      `SELECT COUNT(DISTINCT "seq") AS n FROM "readings"
       WHERE "reservoir_id" = ? AND "device_id" = ? AND "seq" BETWEEN ? AND ?`,
      [gap.reservoirId, gap.deviceId, fromSeq, toSeq],
    )) as Array<{ n: number | string }>;
    return Number(row?.n ?? 0);
  }
}

const size = (r: { fromSeq: number; toSeq: number }) => r.toSeq - r.fromSeq + 1;
