import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import type { LogbookEntry } from '@stillwell/shared/logbook';
import { LogbookQueryDto } from './dto/logbook-query.dto';
import { LogbookEntryRow } from './logbook-entry.entity';
import { toEntry } from './logbook.service';

const COLUMN = { seq: 'e.seq', time: 'e.time', kind: 'e.kind', actorName: 'e.actor_name' } as const;

/** Server-side paging, sorting and filtering of the logbook for the console's grid. */
@Injectable()
export class LogbookQueryService {
  constructor(
    @InjectRepository(LogbookEntryRow) private readonly rows: Repository<LogbookEntryRow>,
  ) {}

  async page(query: LogbookQueryDto): Promise<{ rows: LogbookEntry[]; total: number }> {
    const qb = this.rows.createQueryBuilder('e');
    if (query.kind) {
      if (query.kind.endsWith('.')) qb.andWhere('e.kind LIKE :kind', { kind: `${query.kind}%` });
      else qb.andWhere('e.kind = :kind', { kind: query.kind });
    }
    if (query.actor) qb.andWhere('e.actor_name = :actor', { actor: query.actor });
    // ISO strings in UTC sort as text in time order
    if (query.from) qb.andWhere('e.time >= :from', { from: new Date(query.from).toISOString() });
    if (query.to) qb.andWhere('e.time <= :to', { to: new Date(query.to).toISOString() });
    const pageSize = query.pageSize ?? 50;
    const [rows, total] = await qb
      .orderBy(COLUMN[query.sort ?? 'seq'], query.order === 'asc' ? 'ASC' : 'DESC')
      .addOrderBy('e.seq', 'DESC')
      .skip((query.page ?? 0) * pageSize)
      .take(pageSize)
      .getManyAndCount();
    return { rows: rows.map(toEntry), total };
  }
}
