import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository, type SelectQueryBuilder } from 'typeorm';
import type { LogbookEntry } from '@stillwell/shared/logbook';
import { LogbookFilterDto, LogbookQueryDto } from './dto/logbook-query.dto';
import { LogbookEntryRow } from './logbook-entry.entity';
import { toEntry } from './logbook.service';

const COLUMN = { seq: 'e.seq', time: 'e.time', kind: 'e.kind', actorName: 'e.actor_name' } as const;

/** Server-side paging, sorting and filtering of the logbook for the console's grid and export. */
@Injectable()
export class LogbookQueryService {
  constructor(
    @InjectRepository(LogbookEntryRow) private readonly rows: Repository<LogbookEntryRow>,
  ) {}

  private filtered(query: LogbookFilterDto): SelectQueryBuilder<LogbookEntryRow> {
    const qb = this.rows.createQueryBuilder('e');
    if (query.kind) {
      if (query.kind.endsWith('.')) qb.andWhere('e.kind LIKE :kind', { kind: `${query.kind}%` });
      else qb.andWhere('e.kind = :kind', { kind: query.kind });
    }
    if (query.actor) qb.andWhere('e.actor_name = :actor', { actor: query.actor });
    if (query.gate) {
      // entries about gates list them in payload.controls (orders, commands, rules, shift notes)
      qb.andWhere(
        `EXISTS (SELECT 1 FROM json_each(e.payload, '$.controls') j WHERE j.value = :gate)`,
        { gate: query.gate },
      );
    }
    // ISO strings in UTC sort as text in time order
    if (query.from) qb.andWhere('e.time >= :from', { from: new Date(query.from).toISOString() });
    if (query.to) qb.andWhere('e.time <= :to', { to: new Date(query.to).toISOString() });
    return qb;
  }

  async page(query: LogbookQueryDto): Promise<{ rows: LogbookEntry[]; total: number }> {
    const pageSize = query.pageSize ?? 50;
    const [rows, total] = await this.filtered(query)
      .orderBy(COLUMN[query.sort ?? 'seq'], query.order === 'asc' ? 'ASC' : 'DESC')
      .addOrderBy('e.seq', 'DESC')
      .skip((query.page ?? 0) * pageSize)
      .take(pageSize)
      .getManyAndCount();
    return { rows: rows.map(toEntry), total };
  }

  async one(seq: number): Promise<LogbookEntry> {
    const row = await this.rows.findOneBy({ seq });
    if (!row) throw new NotFoundException(`No logbook entry ${seq}`);
    return toEntry(row);
  }

  /** The filtered entries oldest first, a page at a time (for the export; never all in memory). */
  async *inOrder(query: LogbookFilterDto, pageSize = 500): AsyncGenerator<LogbookEntry[]> {
    let after = 0;
    for (;;) {
      const rows = await this.filtered(query)
        .andWhere('e.seq > :after', { after })
        .orderBy('e.seq', 'ASC')
        .take(pageSize)
        .getMany();
      if (!rows.length) return;
      yield rows.map(toEntry);
      after = rows[rows.length - 1]!.seq;
    }
  }
}
