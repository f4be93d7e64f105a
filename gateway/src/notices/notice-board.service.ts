import { Injectable, NotFoundException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import type { Notice } from '@stillwell/shared/notices';
import type { Env } from '../config';
import { SiteClockService } from '../clock/site-clock.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { ContactRow } from './contact.entity';
import { NoticeRow } from './notice.entity';
import { composeMessage } from './notice-text';
import { noticeView } from './notice-views';
import { RecipientRow } from './recipient.entity';
import { siteNow } from './site-time';
import { ZoneRow } from './zone.entity';

/** The notices as the board shows them: each with its zone, its recipients' standing and a preview. */
@Injectable()
export class NoticeBoardService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly clock: SiteClockService,
    private readonly reservoirs: ReservoirsService,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async one(noticeId: string): Promise<Notice> {
    const n = await this.dataSource.manager.findOneBy(NoticeRow, { id: noticeId });
    if (!n) throw new NotFoundException(`No notice "${noticeId}"`);
    return (await this.views([n]))[0]!;
  }

  async list(reservoirId: string, filter: { orderId?: string } = {}): Promise<Notice[]> {
    this.reservoirs.get(reservoirId);
    const rows = await this.dataSource.manager.find(NoticeRow, {
      where: { reservoirId, ...(filter.orderId ? { orderId: filter.orderId } : {}) },
      order: { preparedAt: 'DESC' },
      take: 500,
    });
    return this.views(rows);
  }

  /** A stakeholder's part of the board: notices of the zones they are a contact in, and only themselves among the recipients. */
  async listForStakeholder(
    reservoirId: string,
    userId: string,
    filter: { orderId?: string } = {},
  ): Promise<Notice[]> {
    const mine = await this.dataSource.manager.find(ContactRow, { where: { userId } });
    const zones = new Set(mine.map((c) => c.zoneId));
    const ids = new Set(mine.map((c) => c.id));
    return (await this.list(reservoirId, filter))
      .filter((n) => zones.has(n.zoneId))
      .map((n) => ({ ...n, recipients: n.recipients.filter((r) => ids.has(r.contactId)) }));
  }

  private async views(rows: NoticeRow[]): Promise<Notice[]> {
    if (!rows.length) return [];
    const m = this.dataSource.manager;
    const zones = await m.find(ZoneRow, {
      where: { id: In([...new Set(rows.map((n) => n.zoneId))]) },
    });
    const recipients = await m.find(RecipientRow, {
      where: { noticeId: In(rows.map((n) => n.id)) },
    });
    const contacts = recipients.length
      ? await m.find(ContactRow, {
          where: { id: In([...new Set(recipients.map((r) => r.contactId))]) },
        })
      : [];
    const demo = this.config.get('DEMO_MODE', { infer: true });
    return rows.map((n) => {
      const zone = zones.find((z) => z.id === n.zoneId)!;
      const mine = recipients
        .filter((r) => r.noticeId === n.id)
        .map((row) => ({ row, contact: contacts.find((c) => c.id === row.contactId)! }));
      const { definition } = this.reservoirs.get(n.reservoirId);
      const first = mine[0]?.contact ?? {
        person: '(no contact)',
        organisation: '(no organisation)',
      };
      let preview: string;
      try {
        preview = composeMessage({
          notice: n,
          zone,
          contact: first,
          reservoir: definition,
          demo,
        }).text;
      } catch (error) {
        preview = `The template cannot be filled: ${(error as Error).message}`;
      }
      return noticeView(n, zone, mine, preview, siteNow(this.clock, n.reservoirId));
    });
  }
}
