import { randomUUID } from 'node:crypto';
import {
  Injectable,
  Logger,
  OnApplicationBootstrap,
  OnModuleDestroy,
  Optional,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In, IsNull } from 'typeorm';
import type { Env } from '../config';
import { SiteClockService } from '../clock/site-clock.service';
import { LeaseService } from '../database/lease.service';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService } from '../logbook/logbook.service';
import { ContactRow } from './contact.entity';
import { DispatchService } from './dispatch.service';
import { NoticeRow } from './notice.entity';
import { RecipientRow } from './recipient.entity';
import { siteNow } from './site-time';

interface Escalation {
  recipientIds: string[];
  from: { person: string; organisation: string };
}

/**
 * Escalation along a zone's chain. A recipient who has not acknowledged within their window (site
 * time, counted from the mail server's acceptance), or whose message bounced, is escalated once:
 * the contacts at the next place of the zone's chain are told, with a word that someone before them
 * was silent. At the end of the chain the escalation is still recorded, so the liaison sees who is
 * silent and that nobody is left to mail: the telephone is next.
 *
 * The windows run on the site clock, like lead times: in the demo the plant runs hundreds of times
 * faster than the wall, and a 30-minute window must pass in plant minutes, not real ones.
 */
@Injectable()
export class EscalationService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(EscalationService.name);
  private timer?: NodeJS.Timeout;
  private running = false;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
    private readonly clock: SiteClockService,
    private readonly dispatch: DispatchService,
    private readonly config: ConfigService<Env, true>,
    @Optional() private readonly lease?: LeaseService,
  ) {}

  onApplicationBootstrap(): void {
    const every = this.config.get('NOTICE_TICK_MS', { infer: true });
    if (every > 0) {
      this.timer = setInterval(() => {
        // one gateway escalates for all
        (this.lease?.acquire('notice-escalation') ?? Promise.resolve(true))
          .then((mine) => (mine ? this.tick() : 0))
          .catch((error: unknown) =>
            this.logger.error(`escalation check failed: ${String(error)}`),
          );
      }, every);
      this.timer.unref();
    }
  }

  onModuleDestroy(): void {
    if (this.timer) clearInterval(this.timer);
  }

  /** One pass: escalates everyone whose window has run out. Returns how many were escalated. */
  async tick(): Promise<number> {
    if (this.running) return 0;
    this.running = true;
    try {
      const escalations = await this.writes.run(() =>
        this.dataSource.transaction((tx) => this.escalateDue(tx)),
      );
      for (const e of escalations) {
        for (const id of e.recipientIds) await this.dispatch.deliver(id, e.from);
      }
      return escalations.length;
    } finally {
      this.running = false;
    }
  }

  private async escalateDue(tx: DataSource['manager']): Promise<Escalation[]> {
    const notices = await tx.find(NoticeRow, { where: { state: 'sent' } });
    if (!notices.length) return [];
    const pending = await tx.find(RecipientRow, {
      where: {
        noticeId: In(notices.map((n) => n.id)),
        acknowledgedAt: IsNull(),
        escalatedAt: IsNull(),
      },
    });
    const out: Escalation[] = [];
    for (const r of pending) {
      const notice = notices.find((n) => n.id === r.noticeId)!;
      const now = siteNow(this.clock, notice.reservoirId);
      const silent = r.deliveredAt !== null && now >= r.deliveredAt + r.ackWindowS * 1000;
      const bounced = r.delivery === 'bounced';
      if (!silent && !bounced) continue;
      const contact = await tx.findOneByOrFail(ContactRow, { id: r.contactId });
      const told = await tx.find(RecipientRow, { where: { noticeId: notice.id } });
      const zoneContacts = await tx.find(ContactRow, {
        where: { zoneId: notice.zoneId, active: true },
      });
      // the next place of the chain, whoever is there; those another escalation told already are not told twice
      const later = zoneContacts.filter((c) => c.escalationOrder > r.chainLevel);
      const nextLevel = Math.min(...later.map((c) => c.escalationOrder));
      const atNext = later.filter((c) => c.escalationOrder === nextLevel);
      const next = atNext.filter((c) => !told.some((t) => t.contactId === c.id));
      r.escalatedAt = now;
      await tx.save(RecipientRow, r);
      const added: RecipientRow[] = [];
      for (const c of next) {
        const row = tx.create(RecipientRow, {
          id: randomUUID(),
          noticeId: notice.id,
          contactId: c.id,
          chainLevel: c.escalationOrder,
          reason: 'escalation',
          leadTimeS: c.leadTimeS,
          ackWindowS: c.ackWindowS,
          delivery: 'not-sent',
          sentAt: now,
          deliveredAt: null,
          bouncedAt: null,
          bounceReason: null,
          messageId: null,
          acknowledgedAt: null,
          acknowledgedVia: null,
          escalatedAt: null,
        });
        await tx.insert(RecipientRow, row);
        added.push(row);
      }
      await this.logbook.append(
        {
          kind: 'notice.escalated',
          actor: null,
          payload: {
            noticeId: notice.id,
            orderId: notice.orderId,
            zoneId: notice.zoneId,
            recipientId: r.id,
            contactId: contact.id,
            person: contact.person,
            organisation: contact.organisation,
            why: bounced ? 'bounced' : 'silent',
            silentForS: r.deliveredAt === null ? null : Math.round((now - r.deliveredAt) / 1000),
            toContactIds: next.map((c) => c.id),
            alreadyTold: atNext.filter((c) => !next.includes(c)).map((c) => c.id),
            endOfChain: later.length === 0,
            siteTime: new Date(now).toISOString(),
          },
        },
        tx,
      );
      if (added.length) {
        out.push({
          recipientIds: added.map((a) => a.id),
          from: { person: contact.person, organisation: contact.organisation },
        });
      }
    }
    return out;
  }
}
