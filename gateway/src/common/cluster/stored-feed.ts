import { randomUUID } from 'node:crypto';
import { Logger } from '@nestjs/common';
import { Redis } from 'ioredis';
import type { Subject, Subscription } from 'rxjs';
import type { StoredBatch } from '../../telemetry/ingestion.service';

const CHANNEL = 'stillwell:stored';

/**
 * Shares every stored batch between the gateways through Redis pub/sub. With shared MQTT
 * subscriptions each gateway ingests a part of the readings; fed with the others' batches too,
 * each one's status, alarm engines and live push see them all. A batch from a peer is put on the
 * local stream and never sent on again.
 */
export class StoredFeed {
  private readonly logger = new Logger(StoredFeed.name);
  private readonly id = randomUUID();
  private readonly pub: Redis;
  private readonly sub: Redis;
  private readonly fromPeers = new WeakSet<StoredBatch>();
  private readonly subscription: Subscription;

  constructor(
    url: string,
    private readonly stored$: Subject<StoredBatch>,
  ) {
    this.pub = new Redis(url, { maxRetriesPerRequest: null });
    this.sub = this.pub.duplicate();
    this.subscription = stored$.subscribe((batch) => {
      if (this.fromPeers.has(batch)) return;
      this.pub
        .publish(CHANNEL, JSON.stringify({ from: this.id, batch }))
        .catch((e: Error) => this.logger.warn(`Sharing a stored batch failed: ${e.message}`));
    });
    this.sub.on('message', (_channel: string, text: string) => this.receive(text));
    this.sub.subscribe(CHANNEL).catch((e: Error) => this.logger.warn(`Redis: ${e.message}`));
  }

  private receive(text: string): void {
    try {
      const { from, batch } = JSON.parse(text) as { from: string; batch: StoredBatch };
      if (from === this.id) return;
      this.fromPeers.add(batch);
      this.stored$.next(batch);
    } catch (error) {
      this.logger.error(`A peer's stored batch could not be taken: ${(error as Error).message}`);
    }
  }

  close(): void {
    this.subscription.unsubscribe();
    this.pub.disconnect();
    this.sub.disconnect();
  }
}
