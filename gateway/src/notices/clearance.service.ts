import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import {
  assessClearance,
  isAffected,
  type ClearanceVerdict,
  type DownstreamClearance,
  type ReleaseOrderFacts,
  type ZoneClearanceInput,
} from '@stillwell/shared/notices';
import { SiteClockService } from '../clock/site-clock.service';
import { LogbookService, type LogbookActor } from '../logbook/logbook.service';
import { ContactRow } from './contact.entity';
import { NoticeRow } from './notice.entity';
import { NoticesService } from './notices.service';
import { RecipientRow } from './recipient.entity';
import { ZoneRow } from './zone.entity';
import { siteNow } from './site-time';

/**
 * The downstream interlock of gate orders, for real: an order whose release reaches a zone's
 * threshold is clear only when every first-call contact of every such zone has had the notice
 * accepted by the mail server and their lead time has run on the site clock. Reading it changes
 * nothing; `emergencyRelease` is the one path that sends at once and records the shortfall.
 */
@Injectable()
export class ClearanceService implements DownstreamClearance {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly clock: SiteClockService,
    private readonly notices: NoticesService,
    private readonly logbook: LogbookService,
  ) {}

  async check(order: ReleaseOrderFacts): Promise<ClearanceVerdict> {
    const m = this.dataSource.manager;
    const zones = (await m.find(ZoneRow, { where: { reservoirId: order.reservoirId } })).filter(
      (z) => isAffected(z, order.targetReleaseM3s, order.currentReleaseM3s),
    );
    const ids = zones.map((z) => z.id);
    const contacts = ids.length
      ? await m.find(ContactRow, { where: { zoneId: In(ids), active: true } })
      : [];
    const notices = ids.length
      ? await m.find(NoticeRow, { where: { orderId: order.orderId, zoneId: In(ids) } })
      : [];
    const recipients = notices.length
      ? await m.find(RecipientRow, {
          where: { noticeId: In(notices.map((n) => n.id)), reason: 'first-call' },
        })
      : [];
    const names = new Map(
      (recipients.length
        ? await m.find(ContactRow, { where: { id: In(recipients.map((r) => r.contactId)) } })
        : []
      ).map((c) => [c.id, c.person]),
    );
    const input: ZoneClearanceInput[] = zones.map((z) => {
      const notice = notices.find((n) => n.zoneId === z.id);
      return {
        zoneId: z.id,
        zoneName: z.name,
        activeContacts: contacts.filter((c) => c.zoneId === z.id).length,
        notice: notice
          ? {
              state: notice.state,
              required: recipients
                .filter((r) => r.noticeId === notice.id)
                .map((r) => ({
                  contactId: r.contactId,
                  contactName: names.get(r.contactId) ?? r.contactId,
                  sentAt: r.sentAt,
                  deliveredAt: r.deliveredAt,
                  leadTimeS: r.leadTimeS,
                })),
            }
          : null,
      };
    });
    return assessClearance(order, input, siteNow(this.clock, order.reservoirId));
  }

  /**
   * An order executed under a declared emergency: every notice not yet out is prepared and sent at
   * once, and whatever lead time the people downstream did not get is recorded, contact by contact.
   */
  async emergencyRelease(
    order: ReleaseOrderFacts,
    actor: LogbookActor | null,
  ): Promise<ClearanceVerdict> {
    const facts = { ...order, emergency: true };
    await this.notices.prepareForOrder(facts, actor);
    const verdict = await this.check(facts);
    if (verdict.shortfalls.length) {
      const now = verdict.checkedAt;
      await this.logbook.append({
        kind: 'notice.lead-time-shortfall',
        actor,
        payload: {
          orderId: order.orderId,
          reservoirId: order.reservoirId,
          siteTime: new Date(now).toISOString(),
          summary: verdict.summary,
          shortfalls: verdict.shortfalls.map((s) => ({
            ...s,
            shortS: s.readyAt === null ? null : Math.max(0, Math.round((s.readyAt - now) / 1000)),
          })),
        },
      });
    }
    return verdict;
  }
}
