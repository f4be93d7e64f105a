import { randomUUID } from 'node:crypto';
import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In, type EntityManager } from 'typeorm';
import {
  DEFAULT_NOTICE_SUBJECT,
  DEFAULT_NOTICE_TEMPLATE,
  isAffected,
  travelTimeFor,
  type Notice,
  type NoticeEdit,
  type ReleaseOrderFacts,
} from '@stillwell/shared/notices';
import { SiteClockService } from '../clock/site-clock.service';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService, type LogbookActor } from '../logbook/logbook.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { ContactRow } from './contact.entity';
import { DispatchService } from './dispatch.service';
import { NoticeBoardService } from './notice-board.service';
import { NoticeRow } from './notice.entity';
import { RecipientRow } from './recipient.entity';
import { travelTimesOf } from './registry.service';
import { ZoneRow } from './zone.entity';
import { siteNow } from './site-time';

/** The contacts told first in a zone: every active one at the lowest place of its chain. */
export function firstCall(contacts: readonly ContactRow[]): ContactRow[] {
  const active = contacts.filter((c) => c.active);
  const level = Math.min(...active.map((c) => c.escalationOrder));
  return active.filter((c) => c.escalationOrder === level);
}

const iso = (ms: number) => new Date(ms).toISOString();

/**
 * Notices from preparation to sending. A notice is one order's release for one zone; preparing it
 * works out the figures (start, arrival from the zone's travel-time table) and who is to be told;
 * the liaison reviews the wording and sends it.
 */
@Injectable()
export class NoticesService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
    private readonly clock: SiteClockService,
    private readonly reservoirs: ReservoirsService,
    private readonly dispatch: DispatchService,
    private readonly board: NoticeBoardService,
  ) {}

  private transaction<T>(job: (tx: EntityManager) => Promise<T>): Promise<T> {
    return this.writes.run(() => this.dataSource.transaction(job));
  }

  /**
   * Prepares (or brings up to date) the notices of an order: one for each zone whose threshold the
   * order's release reaches while raising the flow. The release cannot start before the longest
   * lead time among those to be told has run, so the start given is at least now plus that.
   * Notices of the order for zones no longer affected are withdrawn. Under a declared emergency
   * they are sent at once.
   */
  async prepareForOrder(facts: ReleaseOrderFacts, actor: LogbookActor | null): Promise<Notice[]> {
    this.reservoirs.get(facts.reservoirId);
    const ids = await this.transaction(async (tx) => {
      const now = siteNow(this.clock, facts.reservoirId);
      const zones = await tx.find(ZoneRow, { where: { reservoirId: facts.reservoirId } });
      const affected = zones.filter((z) =>
        isAffected(z, facts.targetReleaseM3s, facts.currentReleaseM3s),
      );
      const contacts = affected.length
        ? await tx.find(ContactRow, {
            where: { zoneId: In(affected.map((z) => z.id)), active: true },
          })
        : [];
      const calls = new Map(
        affected.map((z) => [z.id, firstCall(contacts.filter((c) => c.zoneId === z.id))]),
      );
      const longestLeadS = Math.max(0, ...[...calls.values()].flat().map((c) => c.leadTimeS));
      const startAt = Math.max(facts.plannedStartAt ?? now, now + longestLeadS * 1000);
      const existing = await tx.find(NoticeRow, { where: { orderId: facts.orderId } });
      const touched: string[] = [];
      for (const zone of affected) {
        const { travelTimeS, beyondTable } = travelTimeFor(
          travelTimesOf(zone),
          facts.targetReleaseM3s,
        );
        const figures = {
          releaseM3s: facts.targetReleaseM3s,
          previousReleaseM3s: facts.currentReleaseM3s,
          plannedStartAt: facts.plannedStartAt,
          startAt,
          arrivalAt: startAt + travelTimeS * 1000,
          durationS: facts.durationS,
          travelTimeS,
          beyondTable,
          emergency: facts.emergency,
          updatedAt: now,
        };
        let notice = existing.find((n) => n.zoneId === zone.id);
        if (notice?.state === 'sent') continue; // what was sent stands; a changed order is a new order
        if (notice) Object.assign(notice, figures, { state: 'prepared' });
        else {
          notice = tx.create(NoticeRow, {
            ...figures,
            id: randomUUID(),
            reservoirId: facts.reservoirId,
            orderId: facts.orderId,
            zoneId: zone.id,
            state: 'prepared',
            subject: DEFAULT_NOTICE_SUBJECT,
            template: DEFAULT_NOTICE_TEMPLATE,
            preparedAt: now,
            sentAt: null,
            sentBy: null,
          });
        }
        await tx.save(NoticeRow, notice);
        await this.addressFirstCall(tx, notice, calls.get(zone.id) ?? []);
        touched.push(notice.id);
        await this.logbook.append(
          {
            kind: 'notice.prepared',
            actor,
            payload: {
              noticeId: notice.id,
              orderId: facts.orderId,
              reservoirId: facts.reservoirId,
              zoneId: zone.id,
              zoneName: zone.name,
              releaseM3s: facts.targetReleaseM3s,
              previousReleaseM3s: facts.currentReleaseM3s,
              startAt: iso(startAt),
              arrivalAt: iso(notice.arrivalAt),
              travelTimeS,
              beyondTable,
              emergency: facts.emergency,
              toBeTold: (calls.get(zone.id) ?? []).map((c) => c.id),
            },
          },
          tx,
        );
      }
      for (const stale of existing.filter(
        (n) => n.state === 'prepared' && !touched.includes(n.id),
      )) {
        await this.withdrawWith(
          tx,
          stale,
          actor,
          'the order no longer raises the release above this zone',
        );
      }
      return touched;
    });
    if (facts.emergency) {
      for (const id of ids) await this.send(id, actor, 'emergency');
    }
    return this.board.list(facts.reservoirId, { orderId: facts.orderId });
  }

  /** Makes the not-yet-sent recipients of a notice exactly the zone's first call as it stands now. */
  private async addressFirstCall(
    tx: EntityManager,
    notice: NoticeRow,
    contacts: readonly ContactRow[],
  ): Promise<void> {
    const current = await tx.find(RecipientRow, { where: { noticeId: notice.id } });
    const wanted = new Set(contacts.map((c) => c.id));
    for (const r of current) {
      if (r.delivery === 'not-sent' && r.sentAt === null && !wanted.has(r.contactId))
        await tx.delete(RecipientRow, { id: r.id });
    }
    for (const c of contacts) {
      const row = current.find((r) => r.contactId === c.id);
      if (row && row.sentAt !== null) continue;
      await tx.save(RecipientRow, {
        ...(row ?? {}),
        id: row?.id ?? randomUUID(),
        noticeId: notice.id,
        contactId: c.id,
        chainLevel: c.escalationOrder,
        reason: 'first-call',
        leadTimeS: c.leadTimeS,
        ackWindowS: c.ackWindowS,
        delivery: 'not-sent',
        sentAt: null,
        deliveredAt: null,
        bouncedAt: null,
        bounceReason: null,
        messageId: null,
        acknowledgedAt: null,
        acknowledgedVia: null,
        escalatedAt: null,
      } satisfies RecipientRow);
    }
  }

  /** Withdraws every unsent notice of an order (the order was withdrawn, declined or lapsed). */
  async withdrawOrder(orderId: string, actor: LogbookActor | null, reason: string): Promise<void> {
    await this.transaction(async (tx) => {
      for (const n of await tx.find(NoticeRow, { where: { orderId, state: 'prepared' } })) {
        await this.withdrawWith(tx, n, actor, reason);
      }
    });
  }

  private async withdrawWith(
    tx: EntityManager,
    n: NoticeRow,
    actor: LogbookActor | null,
    reason: string,
  ) {
    n.state = 'withdrawn';
    n.updatedAt = siteNow(this.clock, n.reservoirId);
    await tx.save(NoticeRow, n);
    await this.logbook.append(
      {
        kind: 'notice.withdrawn',
        actor,
        payload: { noticeId: n.id, orderId: n.orderId, zoneId: n.zoneId, reason },
      },
      tx,
    );
  }

  async edit(noticeId: string, edit: NoticeEdit, actor: LogbookActor): Promise<Notice> {
    const notice = await this.transaction(async (tx) => {
      const n = await tx.findOneBy(NoticeRow, { id: noticeId });
      if (!n) throw new NotFoundException(`No notice "${noticeId}"`);
      if (n.state !== 'prepared')
        throw new ConflictException(
          `The notice is ${n.state}: only a prepared notice can be edited`,
        );
      n.subject = edit.subject;
      n.template = edit.template;
      n.updatedAt = siteNow(this.clock, n.reservoirId);
      await tx.save(NoticeRow, n);
      await this.logbook.append(
        { kind: 'notice.edited', actor, payload: { noticeId, orderId: n.orderId, ...edit } },
        tx,
      );
      return n;
    });
    return this.board.one(notice.id);
  }

  /**
   * Sends a prepared notice to its first call. The start is pushed back if the longest lead time
   * among them, counted from now, would run past it; the arrival moves with it. Each message's
   * outcome (delivered or bounced) is recorded as it comes back from the mail server.
   */
  async send(
    noticeId: string,
    actor: LogbookActor | null,
    via: 'liaison' | 'emergency' = 'liaison',
  ): Promise<Notice> {
    const recipients = await this.transaction(async (tx) => {
      const n = await tx.findOneBy(NoticeRow, { id: noticeId });
      if (!n) throw new NotFoundException(`No notice "${noticeId}"`);
      if (n.state !== 'prepared') throw new ConflictException(`The notice is ${n.state} already`);
      const zoneContacts = await tx.find(ContactRow, { where: { zoneId: n.zoneId, active: true } });
      const calls = firstCall(zoneContacts);
      await this.addressFirstCall(tx, n, calls);
      const now = siteNow(this.clock, n.reservoirId);
      const earliest = now + Math.max(0, ...calls.map((c) => c.leadTimeS)) * 1000;
      if (!n.emergency && earliest > n.startAt) {
        n.startAt = earliest;
        n.arrivalAt = earliest + n.travelTimeS * 1000;
      }
      Object.assign(n, {
        state: 'sent',
        sentAt: now,
        sentBy: actor?.username ?? via,
        updatedAt: now,
      });
      await tx.save(NoticeRow, n);
      const rows = await tx.find(RecipientRow, { where: { noticeId } });
      for (const r of rows) {
        r.sentAt = now;
        await tx.save(RecipientRow, r);
      }
      await this.logbook.append(
        {
          kind: 'notice.sent',
          actor,
          payload: {
            noticeId,
            orderId: n.orderId,
            zoneId: n.zoneId,
            via,
            releaseM3s: n.releaseM3s,
            startAt: iso(n.startAt),
            arrivalAt: iso(n.arrivalAt),
            recipients: rows.map((r) => ({ recipientId: r.id, contactId: r.contactId })),
            siteTime: iso(now),
          },
        },
        tx,
      );
      return rows;
    });
    for (const r of recipients) await this.dispatch.deliver(r.id);
    return this.board.one(noticeId);
  }
}
