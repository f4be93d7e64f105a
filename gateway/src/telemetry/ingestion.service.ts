import { Injectable, Logger, OnApplicationBootstrap, OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectRepository } from '@nestjs/typeorm';
import { Subject } from 'rxjs';
import { Repository } from 'typeorm';
import {
  TELEMETRY_SUBSCRIPTION,
  parseTopic,
  validateTelemetry,
  type QuarantineReason,
  type Reading as LiveReading,
} from '@stillwell/shared/telemetry';
import type { Env } from '../config';
import { SiteClockService } from '../clock/site-clock.service';
import { WriteQueueService } from '../database/write-queue.service';
import { MqttService } from '../mqtt/mqtt.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { QuarantinedMessage } from './quarantined-message.entity';
import { Reading } from './reading.entity';
import { ReadingInserter, type NewReading } from './reading-insert';
import { SequenceGap, type NewSequenceGap } from './sequence-gap.entity';
import { SequenceTracker } from './sequence-tracker';

/** Raw payloads kept in quarantine are cut here: enough to see what was wrong, not a disk filler. */
export const PAYLOAD_KEEP_BYTES = 16 * 1024;

export interface IngestionCounters {
  received: number;
  stored: number;
  /** accepted but already stored: a repeated delivery */
  repeats: number;
  /** older than the device's latest: late or repeated, not pushed live */
  late: number;
  quarantined: number;
  gaps: number;
  restarts: number;
  byReason: Partial<Record<QuarantineReason, number>>;
}

/** One stored batch, for the live push: only readings that are news (in sequence, not repeats). */
export interface StoredBatch {
  reservoirId: string;
  readings: LiveReading[];
}

/**
 * Takes every telemetry message from the broker, checks it against the shared schema and the
 * reservoir's channel definitions, and writes accepted readings and quarantined messages in
 * batched transactions. It never throws on a message: every failure is counted and kept.
 */
@Injectable()
export class IngestionService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(IngestionService.name);
  private readonly sequences = new SequenceTracker();
  private readings: NewReading[] = [];
  private fresh: LiveReading[] = [];
  private quarantine: Array<Omit<QuarantinedMessage, 'id'>> = [];
  private gaps: NewSequenceGap[] = [];
  private flushTimer?: NodeJS.Timeout;
  private readonly batchSize: number;
  private readonly flushMs: number;
  private readonly maxFutureS: number;
  private readonly maxPayloadBytes: number;
  private readonly inserter: ReadingInserter;
  readonly stored$ = new Subject<StoredBatch>();
  /** gaps were written: the backfill service takes them up */
  readonly gapsStored$ = new Subject<void>();
  readonly counters: IngestionCounters = {
    received: 0,
    stored: 0,
    repeats: 0,
    late: 0,
    quarantined: 0,
    gaps: 0,
    restarts: 0,
    byReason: {},
  };

  constructor(
    @InjectRepository(Reading) private readonly readingRepo: Repository<Reading>,
    private readonly mqtt: MqttService,
    private readonly reservoirs: ReservoirsService,
    private readonly clock: SiteClockService,
    private readonly writes: WriteQueueService,
    config: ConfigService<Env, true>,
  ) {
    this.batchSize = config.get('INGEST_BATCH_SIZE', { infer: true });
    this.flushMs = config.get('INGEST_FLUSH_MS', { infer: true });
    this.maxFutureS = config.get('TELEMETRY_MAX_FUTURE_S', { infer: true });
    this.maxPayloadBytes = config.get('MQTT_MAX_PAYLOAD_BYTES', { infer: true });
    this.inserter = new ReadingInserter(readingRepo.manager.connection.driver);
  }

  async onApplicationBootstrap(): Promise<void> {
    // Resume gap detection where the last run left off.
    const rows: Array<{ reservoir_id: string; device_id: string; seq: number; time: number }> =
      await this.readingRepo.query(
        `SELECT r.reservoir_id, r.device_id, r.seq, r.time FROM readings r
         JOIN (SELECT reservoir_id, device_id, MAX(time) AS t FROM readings GROUP BY reservoir_id, device_id) m
           ON r.reservoir_id = m.reservoir_id AND r.device_id = m.device_id AND r.time = m.t`,
      );
    for (const row of rows)
      this.sequences.seed(`${row.reservoir_id}/${row.device_id}`, row.seq, row.time);
    this.mqtt.subscribe(TELEMETRY_SUBSCRIPTION, (topic, payload) => this.receive(topic, payload));
  }

  async onModuleDestroy(): Promise<void> {
    await this.flush();
  }

  /** Handles one MQTT message. Synchronous and total: whatever arrives, nothing escapes. */
  receive(topic: string, payload: Buffer): void {
    this.counters.received += 1;
    const receivedAt = Date.now();
    // an oversized message is not decoded whole: its head is kept, the rest is refused unread
    const oversized = payload.length > this.maxPayloadBytes;
    const text = (oversized ? payload.subarray(0, PAYLOAD_KEEP_BYTES) : payload).toString('utf8');
    const parsed = parseTopic(topic);
    if (!parsed || parsed.kind !== 'telemetry' || !parsed.deviceId) {
      return this.reject(
        topic,
        null,
        'bad-topic',
        'not a telemetry topic',
        text,
        payload.length,
        receivedAt,
      );
    }
    const reservoir = this.reservoirs.find(parsed.reservoirId);
    if (!reservoir) {
      return this.reject(
        topic,
        null,
        'unknown-reservoir',
        `no reservoir "${parsed.reservoirId}"`,
        text,
        payload.length,
        receivedAt,
      );
    }
    if (oversized) {
      return this.reject(
        topic,
        parsed.reservoirId,
        'bad-shape',
        `payload of ${payload.length} bytes is over the limit of ${this.maxPayloadBytes} bytes (MQTT_MAX_PAYLOAD_BYTES)`,
        text,
        payload.length,
        receivedAt,
      );
    }
    const { speed } = this.clock.snapshot(parsed.reservoirId);
    const result = validateTelemetry(text, {
      topicDeviceId: parsed.deviceId,
      channels: reservoir.channels,
      nowMs: this.clock.now(parsed.reservoirId),
      // one wall second of plant time on top, for transport jitter when the plant runs fast
      maxFutureMs: this.maxFutureS * 1000 + speed * 1000,
    });
    if (!result.ok) {
      const { reason, detail } = result.rejection;
      return this.reject(
        topic,
        parsed.reservoirId,
        reason,
        detail,
        text,
        payload.length,
        receivedAt,
      );
    }
    const r = result.reading;
    const verdict = this.sequences.observe(`${parsed.reservoirId}/${r.deviceId}`, r.seq, r.timeMs);
    if (verdict.kind === 'gap') {
      this.counters.gaps += 1;
      this.gaps.push({
        reservoirId: parsed.reservoirId,
        deviceId: r.deviceId,
        fromSeq: verdict.fromSeq,
        toSeq: verdict.toSeq,
        detectedAt: receivedAt,
      });
    } else if (verdict.kind === 'restart') {
      this.counters.restarts += 1;
      this.logger.warn(`Device ${r.deviceId} restarted its sequence at ${r.seq}`);
    }
    this.readings.push({
      reservoirId: parsed.reservoirId,
      deviceId: r.deviceId,
      channel: r.channel,
      seq: r.seq,
      time: r.timeMs,
      value: r.value,
      quality: r.quality,
      receivedAt,
    });
    if (verdict.kind === 'late') this.counters.late += 1;
    else {
      this.fresh.push({
        reservoirId: parsed.reservoirId,
        deviceId: r.deviceId,
        channel: r.channel,
        seq: r.seq,
        t: r.timeMs,
        v: r.value,
        q: r.quality,
      });
    }
    this.schedule();
  }

  /** Writes everything buffered in one transaction; resolves when it is on disk. */
  flush(): Promise<void> {
    clearTimeout(this.flushTimer);
    this.flushTimer = undefined;
    if (!this.readings.length && !this.quarantine.length && !this.gaps.length)
      return this.writes.run(() => undefined);
    const readings = this.readings;
    const fresh = this.fresh;
    const quarantine = this.quarantine;
    const gaps = this.gaps;
    this.readings = [];
    this.fresh = [];
    this.quarantine = [];
    this.gaps = [];
    return this.writes
      .run(() =>
        this.readingRepo.manager.transaction(async (tx) => {
          const inserted = await this.inserter.insert(tx.queryRunner!, readings);
          if (quarantine.length) await tx.insert(QuarantinedMessage, quarantine);
          if (gaps.length) await tx.insert(SequenceGap, gaps);
          return inserted;
        }),
      )
      .then(
        (inserted) => {
          this.counters.stored += inserted;
          this.counters.repeats += readings.length - inserted;
          this.publish(fresh);
          if (gaps.length) this.gapsStored$.next();
        },
        (error: Error) => {
          // Put the batch back so nothing is lost; the next flush tries again.
          this.logger.error(`Writing ${readings.length} readings failed: ${error.message}`);
          this.readings.unshift(...readings);
          this.fresh.unshift(...fresh);
          this.quarantine.unshift(...quarantine);
          this.gaps.unshift(...gaps);
          this.schedule();
        },
      );
  }

  private publish(fresh: LiveReading[]): void {
    const byReservoir = new Map<string, LiveReading[]>();
    for (const r of fresh) {
      const list = byReservoir.get(r.reservoirId);
      if (list) list.push(r);
      else byReservoir.set(r.reservoirId, [r]);
    }
    for (const [reservoirId, readings] of byReservoir) this.stored$.next({ reservoirId, readings });
  }

  private schedule(): void {
    if (this.readings.length + this.quarantine.length >= this.batchSize) {
      void this.flush();
    } else if (!this.flushTimer) {
      this.flushTimer = setTimeout(() => void this.flush(), this.flushMs);
    }
  }

  private reject(
    topic: string,
    reservoirId: string | null,
    reason: QuarantineReason,
    detail: string,
    text: string,
    bytes: number,
    receivedAt: number,
  ): void {
    this.counters.quarantined += 1;
    this.counters.byReason[reason] = (this.counters.byReason[reason] ?? 0) + 1;
    this.quarantine.push({
      receivedAt,
      topic,
      reservoirId,
      reason,
      detail,
      payload: text.length > PAYLOAD_KEEP_BYTES ? text.slice(0, PAYLOAD_KEEP_BYTES) : text,
      payloadBytes: bytes,
    });
    this.schedule();
  }
}
