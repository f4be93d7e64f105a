import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import {
  capAlertSchema,
  capDateTime,
  capSeverity,
  capUrgency,
  formatDistance,
  formatRelease,
  formatSiteTime,
  type CapAlert,
  type CapFeed,
} from '@stillwell/shared/notices';
import type { Env } from '../../config';
import { SiteClockService } from '../../clock/site-clock.service';
import { addressOf } from '../../mail/mail-transport.service';
import { ReservoirsService } from '../../reservoirs/reservoirs.service';
import { AckLinks } from '../ack-links';
import { NoticeRow } from '../notice.entity';
import { durationText } from '../notice-text';
import { ZoneRow } from '../zone.entity';
import { alertDocument, atomFeed } from './cap-xml';
import { siteNow } from '../site-time';

const DAY_MS = 86_400_000;

/**
 * The public feed for emergency-management systems: one OASIS CAP 1.2 alert per active notice
 * (sent, not ended at its zone, not superseded by a later notice to the same zone). Times are the
 * site clock's, like every notice time; in demo mode the status is Exercise, never Actual.
 */
@Injectable()
export class FeedService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly clock: SiteClockService,
    private readonly reservoirs: ReservoirsService,
    private readonly links: AckLinks,
    private readonly config: ConfigService<Env, true>,
  ) {}

  private async active(): Promise<Array<{ notice: NoticeRow; zone: ZoneRow }>> {
    const m = this.dataSource.manager;
    const sent = await m.find(NoticeRow, { where: { state: 'sent' }, order: { sentAt: 'DESC' } });
    const zones = sent.length
      ? await m.find(ZoneRow, { where: { id: In([...new Set(sent.map((n) => n.zoneId))]) } })
      : [];
    const seen = new Set<string>();
    const out: Array<{ notice: NoticeRow; zone: ZoneRow }> = [];
    for (const notice of sent) {
      if (seen.has(notice.zoneId)) continue; // a later notice to the zone supersedes this one
      seen.add(notice.zoneId);
      const ends =
        notice.durationS === null ? Infinity : notice.arrivalAt + notice.durationS * 1000;
      if (siteNow(this.clock, notice.reservoirId) >= ends) continue;
      out.push({ notice, zone: zones.find((z) => z.id === notice.zoneId)! });
    }
    return out;
  }

  private alertOf(notice: NoticeRow, zone: ZoneRow): CapAlert {
    const { definition } = this.reservoirs.get(notice.reservoirId);
    const demo = this.config.get('DEMO_MODE', { infer: true });
    const now = siteNow(this.clock, notice.reservoirId);
    const at = (ms: number) => formatSiteTime(ms, definition.timeZone);
    const release = formatRelease(notice.releaseM3s);
    const ends =
      notice.durationS === null
        ? notice.arrivalAt + DAY_MS
        : notice.arrivalAt + notice.durationS * 1000;
    const alert: CapAlert = {
      identifier: `stillwell-${notice.reservoirId}-${notice.id}`,
      sender: addressOf(this.config.get('MAIL_FROM', { infer: true })),
      sent: capDateTime(notice.sentAt ?? now),
      status: demo ? 'Exercise' : 'Actual',
      msgType: 'Alert',
      scope: 'Public',
      ...(demo
        ? { note: 'Demonstration: an invented dam, river and places; no water is being released.' }
        : {}),
      info: [
        {
          language: 'en-GB',
          category: ['Met'],
          event: 'Dam release: rising river',
          responseType: ['Prepare', 'Avoid'],
          urgency: capUrgency(notice.arrivalAt, now),
          severity: capSeverity(notice.releaseM3s, zone.affectedAtM3s),
          certainty: 'Likely',
          onset: capDateTime(notice.arrivalAt),
          expires: capDateTime(ends),
          senderName: `${definition.damName} (${definition.owner})`,
          headline: `${definition.damName} release of about ${Math.round(notice.releaseM3s)} m3/s reaching ${zone.name} ${at(notice.arrivalAt)}`,
          description: [
            `${definition.damName} on the ${definition.river} is raising its release to about ${release}, starting ${at(notice.startAt)}.`,
            `The rise is expected at ${zone.name} (${formatDistance(zone.distanceM)} downstream) at about ${at(notice.arrivalAt)}, lasting ${durationText(notice.durationS)}.`,
            ...(notice.emergency ? ['Released under a declared emergency at the dam.'] : []),
          ].join(' '),
          instruction: `Keep people, vehicles and equipment clear of the river banks at ${zone.name} until the release has ended.`,
          parameter: [
            { valueName: 'releaseM3s', value: String(Math.round(notice.releaseM3s)) },
            { valueName: 'travelTimeS', value: String(notice.travelTimeS) },
          ],
          area: [
            {
              areaDesc: `${zone.name}, ${formatDistance(zone.distanceM)} below ${definition.damName} on the ${definition.river}`,
            },
          ],
        },
      ],
    };
    // refuse to publish anything outside the CAP 1.2 lists rather than publish it wrong
    return capAlertSchema.parse(alert);
  }

  async json(): Promise<CapFeed> {
    const alerts = (await this.active()).map(({ notice, zone }) => this.alertOf(notice, zone));
    return { generatedAt: capDateTime(Date.now()), alerts };
  }

  async atom(): Promise<string> {
    const base = this.links.base();
    const entries = (await this.active()).map(({ notice, zone }) => ({
      alert: this.alertOf(notice, zone),
      url: `${base}/api/notices/alerts/${notice.id}.xml`,
      updated: new Date(notice.updatedAt).toISOString(),
    }));
    return atomFeed({
      id: `urn:stillwell:notices:${base}`,
      title: 'Stillwell: active downstream release notices',
      updated: new Date().toISOString(),
      selfUrl: `${base}/api/notices/feed.xml`,
      author: 'Stillwell downstream notices',
      entries,
    });
  }

  /** One alert's standalone CAP document, or null when it is not active (any more). */
  async alert(noticeId: string): Promise<string | null> {
    const found = (await this.active()).find((a) => a.notice.id === noticeId);
    return found ? alertDocument(this.alertOf(found.notice, found.zone)) : null;
  }
}
