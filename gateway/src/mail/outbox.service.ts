import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { OutboxMessage } from '@stillwell/shared/notices';
import { WriteQueueService } from '../database/write-queue.service';
import { readMimeText } from './mime-text';
import { OutboxMessageRow } from './outbox-message.entity';

/** What the demo mail server received, kept in SQLite so the demo outbox survives a restart. */
@Injectable()
export class OutboxService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
  ) {}

  async store(envelope: { from: string; to: string[] }, raw: string): Promise<number> {
    const { subject } = readMimeText(raw);
    return this.writes.run(async () => {
      const result = await this.dataSource.getRepository(OutboxMessageRow).insert({
        receivedAt: Date.now(),
        envelopeFrom: envelope.from,
        envelopeTo: JSON.stringify(envelope.to),
        subject,
        raw,
      });
      return Number(result.identifiers[0]?.id);
    });
  }

  /** Newest first. */
  async list(limit = 200): Promise<OutboxMessage[]> {
    const rows = await this.dataSource
      .getRepository(OutboxMessageRow)
      .find({ order: { id: 'DESC' }, take: limit });
    return rows.map((r) => ({
      id: r.id,
      receivedAt: r.receivedAt,
      from: r.envelopeFrom,
      to: JSON.parse(r.envelopeTo) as string[],
      subject: r.subject,
      text: readMimeText(r.raw).text,
    }));
  }

  /** The source as received, for tests and for anyone who wants to see the headers. */
  async raw(id: number): Promise<string | null> {
    return (await this.dataSource.getRepository(OutboxMessageRow).findOneBy({ id }))?.raw ?? null;
  }
}
