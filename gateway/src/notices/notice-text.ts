import {
  formatDistance,
  formatDuration,
  formatRelease,
  formatSiteTime,
  renderTemplate,
  type TemplateValues,
} from '@stillwell/shared/notices';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { ContactRow } from './contact.entity';
import type { NoticeRow } from './notice.entity';
import type { ZoneRow } from './zone.entity';

export interface MessageParts {
  notice: NoticeRow;
  zone: ZoneRow;
  contact: Pick<ContactRow, 'person' | 'organisation'>;
  reservoir: Pick<ReservoirDefinition, 'damName' | 'river' | 'timeZone'>;
  demo: boolean;
  /** the personal acknowledgement link; absent in previews */
  link?: string;
  /** set when this message goes to the next in the chain because someone was silent */
  escalatedFrom?: { person: string; organisation: string };
}

export function durationText(durationS: number | null): string {
  return durationS === null ? 'until further notice' : formatDuration(durationS);
}

export function templateValues(p: MessageParts): TemplateValues {
  const t = (ms: number) => formatSiteTime(ms, p.reservoir.timeZone);
  return {
    organisation: p.contact.organisation,
    person: p.contact.person,
    zone: p.zone.name,
    distance: formatDistance(p.zone.distanceM),
    release: formatRelease(p.notice.releaseM3s),
    start: t(p.notice.startAt),
    arrival: t(p.notice.arrivalAt),
    duration: durationText(p.notice.durationS),
    dam: p.reservoir.damName,
    river: p.reservoir.river,
  };
}

/**
 * The message one contact receives: their plain-language text from the liaison's template, then the
 * figures and the link, which no edit of the template can remove.
 */
export function composeMessage(p: MessageParts): { subject: string; text: string } {
  const values = templateValues(p);
  const subject = renderTemplate(p.notice.subject, values);
  const lines: string[] = [];
  if (p.demo)
    lines.push('DEMONSTRATION ONLY: an invented dam and river; no water is being released.', '');
  if (p.notice.emergency)
    lines.push(
      'DECLARED EMERGENCY at the dam: this release may start before the usual notice period.',
      '',
    );
  if (p.escalatedFrom) {
    lines.push(
      `You are receiving this because ${p.escalatedFrom.person} (${p.escalatedFrom.organisation}) has not acknowledged it,`,
      `and you are next in the chain for ${p.zone.name}.`,
      '',
    );
  }
  lines.push(renderTemplate(p.notice.template, values), '');
  lines.push(
    `Expected release: ${values.release}`,
    `Release starts at the dam: ${values.start}`,
    `Expected arrival at ${p.zone.name} (${values.distance} downstream): ${values.arrival}`,
    `High flow at ${p.zone.name} lasting: ${values.duration}`,
  );
  if (p.notice.beyondTable === 'above') {
    lines.push(
      'This release is larger than any in our travel-time table: the water may arrive earlier than stated.',
    );
  }
  lines.push('');
  if (p.link) {
    lines.push(
      'Please acknowledge that you have received this notice by opening your personal link:',
      p.link,
      '',
    );
  }
  lines.push(
    `Sent by the downstream liaison of ${p.reservoir.damName}. Times are the dam's local time.`,
    'Arrival times are estimates: the dam operating rules and the emergency action plan prevail.',
  );
  return { subject, text: lines.join('\n') };
}
