import { ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import type { MyRelease } from '@stillwell/shared/notices';
import type { Env } from '../config';
import { SiteClockService } from '../clock/site-clock.service';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService, type LogbookActor } from '../logbook/logbook.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { ContactRow } from './contact.entity';
import { NoticeRow } from './notice.entity';
import { composeMessage } from './notice-text';
import { RecipientRow } from './recipient.entity';
import { ZoneRow } from './zone.entity';
import { siteNow } from './site-time';

export interface AckOutcome {
  /** false when it had been acknowledged before: nothing new was recorded */
  recorded: boolean;
  acknowledgedAt: number;
  person: string;
  organisation: string;
  zoneName: string;
  releaseM3s: number;
  arrivalAt: number;
  timeZone: string;
}

/**
 * Acknowledgements: through the personal link in the message, or by a stakeholder signed in to the
 * console. The first one is recorded (row and logbook entry, in one transaction); any later one
 * changes nothing and says when it was acknowledged.
 */
@Injectable()
export class AcknowledgementsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
    private readonly clock: SiteClockService,
    private readonly reservoirs: ReservoirsService,
    private readonly config: ConfigService<Env, true>,
  ) {}

  acknowledge(
    recipientId: string,
    via: 'link' | 'console',
    actor: LogbookActor | null,
    userId?: string,
  ): Promise<AckOutcome> {
    return this.writes.run(() =>
      this.dataSource.transaction(async (tx) => {
        const r = await tx.findOneBy(RecipientRow, { id: recipientId });
        if (!r) throw new NotFoundException('No such notice recipient');
        const contact = await tx.findOneByOrFail(ContactRow, { id: r.contactId });
        if (userId !== undefined && contact.userId !== userId) {
          throw new ForbiddenException('This notice was sent to someone else');
        }
        const notice = await tx.findOneByOrFail(NoticeRow, { id: r.noticeId });
        const zone = await tx.findOneByOrFail(ZoneRow, { id: notice.zoneId });
        const { definition } = this.reservoirs.get(notice.reservoirId);
        const recorded = r.acknowledgedAt === null;
        if (recorded) {
          const now = siteNow(this.clock, notice.reservoirId);
          r.acknowledgedAt = now;
          r.acknowledgedVia = via;
          await tx.save(RecipientRow, r);
          await this.logbook.append(
            {
              kind: 'notice.acknowledged',
              actor,
              payload: {
                noticeId: notice.id,
                orderId: notice.orderId,
                zoneId: zone.id,
                zoneName: zone.name,
                recipientId: r.id,
                contactId: contact.id,
                person: contact.person,
                organisation: contact.organisation,
                via,
                siteTime: new Date(now).toISOString(),
                afterDeliveryS:
                  r.deliveredAt === null ? null : Math.round((now - r.deliveredAt) / 1000),
              },
            },
            tx,
          );
        }
        return {
          recorded,
          acknowledgedAt: r.acknowledgedAt!,
          person: contact.person,
          organisation: contact.organisation,
          zoneName: zone.name,
          releaseM3s: notice.releaseM3s,
          arrivalAt: notice.arrivalAt,
          timeZone: definition.timeZone,
        };
      }),
    );
  }

  /**
   * The releases a stakeholder's zones are told about: sent, not withdrawn, and not yet over at
   * the zone (upcoming until the rise arrives, then active for its duration).
   */
  async mine(userId: string): Promise<MyRelease[]> {
    const m = this.dataSource.manager;
    const contacts = await m.find(ContactRow, { where: { userId, active: true } });
    if (!contacts.length) return [];
    const notices = await m.find(NoticeRow, {
      where: { zoneId: In([...new Set(contacts.map((c) => c.zoneId))]), state: 'sent' },
      order: { arrivalAt: 'ASC' },
    });
    const out: MyRelease[] = [];
    const demo = this.config.get('DEMO_MODE', { infer: true });
    for (const notice of notices) {
      const now = siteNow(this.clock, notice.reservoirId);
      const ends =
        notice.durationS === null ? Infinity : notice.arrivalAt + notice.durationS * 1000;
      if (now >= ends) continue;
      const zone = await m.findOneByOrFail(ZoneRow, { id: notice.zoneId });
      const { definition } = this.reservoirs.get(notice.reservoirId);
      for (const contact of contacts.filter((c) => c.zoneId === notice.zoneId)) {
        const r = await m.findOneBy(RecipientRow, { noticeId: notice.id, contactId: contact.id });
        out.push({
          recipientId: r?.id ?? null,
          noticeId: notice.id,
          reservoirId: notice.reservoirId,
          damName: definition.damName,
          timeZone: definition.timeZone,
          zoneName: zone.name,
          organisation: contact.organisation,
          releaseM3s: notice.releaseM3s,
          startAt: notice.startAt,
          arrivalAt: notice.arrivalAt,
          durationS: notice.durationS,
          phase: now < notice.arrivalAt ? 'upcoming' : 'active',
          message: composeMessage({ notice, zone, contact, reservoir: definition, demo }).text,
          acknowledgedAt: r?.acknowledgedAt ?? null,
          emergency: Boolean(notice.emergency),
        });
      }
    }
    return out;
  }
}
