import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { Env } from '../config';
import { SiteClockService } from '../clock/site-clock.service';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService } from '../logbook/logbook.service';
import { MailTransport } from '../mail/mail-transport.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { AckLinks } from './ack-links';
import { ContactRow } from './contact.entity';
import { NoticeRow } from './notice.entity';
import { composeMessage } from './notice-text';
import { RecipientRow } from './recipient.entity';
import { ZoneRow } from './zone.entity';
import { siteNow } from './site-time';

/**
 * Sends one recipient's message and records what the mail server answered. The mail goes out
 * outside any transaction (a slow server must not hold the one writer); the outcome is written
 * with its logbook entry afterwards: notice.delivered when the server accepted it, notice.bounced
 * when it refused it or could not be reached.
 */
@Injectable()
export class DispatchService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
    private readonly clock: SiteClockService,
    private readonly mail: MailTransport,
    private readonly links: AckLinks,
    private readonly reservoirs: ReservoirsService,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async deliver(
    recipientId: string,
    escalatedFrom?: { person: string; organisation: string },
  ): Promise<RecipientRow> {
    const m = this.dataSource.manager;
    const recipient = await m.findOneByOrFail(RecipientRow, { id: recipientId });
    const notice = await m.findOneByOrFail(NoticeRow, { id: recipient.noticeId });
    const contact = await m.findOneByOrFail(ContactRow, { id: recipient.contactId });
    const zone = await m.findOneByOrFail(ZoneRow, { id: notice.zoneId });
    const { definition } = this.reservoirs.get(notice.reservoirId);
    const { token } = this.links.sign(recipient.id);
    const message = composeMessage({
      notice,
      zone,
      contact,
      reservoir: definition,
      demo: this.config.get('DEMO_MODE', { infer: true }),
      link: this.links.url(token),
      escalatedFrom,
    });
    const outcome = await this.mail.send({
      to: contact.email,
      subject: message.subject,
      text: message.text,
      headers: { 'X-Stillwell-Notice': notice.id, 'X-Stillwell-Recipient': recipient.id },
    });
    return this.writes.run(() =>
      this.dataSource.transaction(async (tx) => {
        const row = await tx.findOneByOrFail(RecipientRow, { id: recipientId });
        const now = siteNow(this.clock, notice.reservoirId);
        const about = {
          noticeId: notice.id,
          orderId: notice.orderId,
          zoneId: zone.id,
          zoneName: zone.name,
          recipientId: row.id,
          contactId: contact.id,
          person: contact.person,
          organisation: contact.organisation,
          email: contact.email,
          siteTime: new Date(now).toISOString(),
        };
        if (outcome.accepted) {
          Object.assign(row, {
            delivery: 'delivered',
            deliveredAt: now,
            messageId: outcome.messageId,
            bouncedAt: null,
            bounceReason: null,
          });
          await tx.save(RecipientRow, row);
          await this.logbook.append(
            {
              kind: 'notice.delivered',
              actor: null,
              payload: { ...about, messageId: outcome.messageId, server: outcome.response },
            },
            tx,
          );
        } else {
          Object.assign(row, { delivery: 'bounced', bouncedAt: now, bounceReason: outcome.reason });
          await tx.save(RecipientRow, row);
          await this.logbook.append(
            { kind: 'notice.bounced', actor: null, payload: { ...about, reason: outcome.reason } },
            tx,
          );
        }
        return row;
      }),
    );
  }
}
