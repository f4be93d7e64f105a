import type { Notice, Recipient, Standing } from '@stillwell/shared/notices';
import type { ContactRow } from './contact.entity';
import type { NoticeRow } from './notice.entity';
import type { RecipientRow } from './recipient.entity';
import type { ZoneRow } from './zone.entity';

/** Where a recipient stands at site time `now` (see STANDINGS in the shared package). */
export function standingOf(r: RecipientRow, now: number): Standing {
  if (r.acknowledgedAt !== null) return 'acknowledged';
  if (r.delivery === 'bounced') return 'bounced';
  if (r.delivery === 'not-sent' || r.deliveredAt === null) return 'waiting';
  return now >= r.deliveredAt + r.ackWindowS * 1000 ? 'silent' : 'told';
}

export function recipientView(r: RecipientRow, c: ContactRow, now: number): Recipient {
  return {
    id: r.id,
    contactId: r.contactId,
    organisation: c.organisation,
    person: c.person,
    role: c.role,
    email: c.email,
    phone: c.phone,
    chainLevel: r.chainLevel,
    reason: r.reason,
    delivery: r.delivery,
    standing: standingOf(r, now),
    sentAt: r.sentAt,
    deliveredAt: r.deliveredAt,
    bouncedAt: r.bouncedAt,
    bounceReason: r.bounceReason,
    acknowledgedAt: r.acknowledgedAt,
    acknowledgedVia: r.acknowledgedVia,
    ackDueAt: r.deliveredAt === null ? null : r.deliveredAt + r.ackWindowS * 1000,
    escalatedAt: r.escalatedAt,
    leadTimeS: r.leadTimeS,
    leadTimeRunsAt:
      r.deliveredAt === null ? null : (r.sentAt ?? r.deliveredAt) + r.leadTimeS * 1000,
  };
}

export function noticeView(
  n: NoticeRow,
  zone: ZoneRow,
  recipients: Array<{ row: RecipientRow; contact: ContactRow }>,
  preview: string,
  now: number,
): Notice {
  return {
    id: n.id,
    reservoirId: n.reservoirId,
    orderId: n.orderId,
    zoneId: n.zoneId,
    zoneName: zone.name,
    distanceM: zone.distanceM,
    affectedAtM3s: zone.affectedAtM3s,
    state: n.state,
    emergency: Boolean(n.emergency),
    releaseM3s: n.releaseM3s,
    previousReleaseM3s: n.previousReleaseM3s,
    startAt: n.startAt,
    arrivalAt: n.arrivalAt,
    durationS: n.durationS,
    travelTimeS: n.travelTimeS,
    beyondTable: n.beyondTable,
    subject: n.subject,
    template: n.template,
    preview,
    preparedAt: n.preparedAt,
    sentAt: n.sentAt,
    sentBy: n.sentBy,
    recipients: recipients
      .sort(
        (a, b) =>
          a.row.chainLevel - b.row.chainLevel || a.contact.person.localeCompare(b.contact.person),
      )
      .map(({ row, contact }) => recipientView(row, contact, now)),
  };
}
