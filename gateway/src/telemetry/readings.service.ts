import { BadRequestException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import type { Quality, ReadingSeries } from '@stillwell/shared/telemetry';
import { SiteClockService } from '../clock/site-clock.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { QuarantinedMessage } from './quarantined-message.entity';
import { Reading } from './reading.entity';
import { SequenceGap } from './sequence-gap.entity';

const DEFAULT_WINDOW_MS = 6 * 60 * 60 * 1000;
const DEFAULT_LIMIT = 20_000;

/** Read side of the stored telemetry. */
@Injectable()
export class ReadingsService {
  constructor(
    @InjectRepository(Reading) private readonly readings: Repository<Reading>,
    @InjectRepository(QuarantinedMessage)
    private readonly quarantine: Repository<QuarantinedMessage>,
    @InjectRepository(SequenceGap) private readonly gaps: Repository<SequenceGap>,
    private readonly reservoirs: ReservoirsService,
    private readonly clock: SiteClockService,
  ) {}

  /** A channel's readings in [from, to], oldest first; the most recent `limit` when there are more. */
  async series(
    reservoirId: string,
    channel: string,
    range: { from?: string; to?: string; limit?: number },
  ): Promise<ReadingSeries> {
    const { channels } = this.reservoirs.get(reservoirId);
    const def = channels.get(channel);
    if (!def) throw new NotFoundException(`Reservoir "${reservoirId}" has no channel "${channel}"`);
    const to = range.to ? Date.parse(range.to) : this.clock.now(reservoirId);
    const from = range.from ? Date.parse(range.from) : to - DEFAULT_WINDOW_MS;
    if (from > to)
      throw new BadRequestException(`from (${range.from}) is after to (${range.to ?? 'now'})`);
    const rows = await this.readings
      .createQueryBuilder('r')
      .select(['r.time', 'r.value', 'r.quality'])
      .where('r.reservoir_id = :reservoirId AND r.channel = :channel', { reservoirId, channel })
      .andWhere('r.time BETWEEN :from AND :to', { from, to })
      .orderBy('r.time', 'DESC')
      .limit(range.limit ?? DEFAULT_LIMIT)
      .getMany();
    rows.reverse();
    return {
      channel,
      unit: def.unit,
      t: rows.map((r) => r.time),
      v: rows.map((r) => r.value),
      q: rows.map((r) => r.quality as Quality),
    };
  }

  recentQuarantine(limit = 100): Promise<QuarantinedMessage[]> {
    return this.quarantine.find({ order: { id: 'DESC' }, take: limit });
  }

  gapsOf(reservoirId: string): Promise<SequenceGap[]> {
    this.reservoirs.get(reservoirId);
    return this.gaps.find({ where: { reservoirId }, order: { id: 'DESC' }, take: 1000 });
  }
}
