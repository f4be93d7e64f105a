import type { AlarmEvent } from '@stillwell/shared/alarms';
import type { ReplayEntry } from '@stillwell/shared/replay';

/** One line of the replay's record: a logbook entry, or an alarm event the logbook does not hold. */
export interface TimelineItem {
  key: string;
  siteTimeMs: number;
  kind: string;
  who: string | null;
  text: string;
  estimated: boolean;
}

const TEXT_FIELDS = ['text', 'comment', 'reason', 'message', 'label', 'summary', 'title'] as const;

/** The words of an entry worth a line: its text, comment or reason, else what it is about. */
export function entryText(payload: Record<string, unknown>): string {
  for (const field of TEXT_FIELDS) {
    const v = payload[field];
    if (typeof v === 'string' && v.trim()) return v.trim();
  }
  const about = [payload.orderId, payload.noticeId, payload.conditionId, payload.username]
    .filter((x) => typeof x === 'string' || typeof x === 'number')
    .join(' ');
  return about;
}

/**
 * The logbook entries and the alarm events merged in time order. People's alarm actions are in
 * the logbook already (an event with logbookSeq), so only the system's raises and clears are added.
 */
export function timeline(entries: readonly ReplayEntry[], alarms: readonly AlarmEvent[]) {
  const items: TimelineItem[] = entries.map((e) => ({
    key: `entry-${e.seq}`,
    siteTimeMs: e.siteTimeMs,
    kind: e.kind,
    who: e.actorName,
    text: entryText(e.payload),
    estimated: e.timeSource === 'estimated',
  }));
  for (const a of alarms) {
    if (a.logbookSeq !== null) continue;
    items.push({
      key: `alarm-${a.id}`,
      siteTimeMs: a.siteTimeMs,
      kind: `alarm ${a.kind}`,
      who: a.actor,
      text: `${a.conditionId}${a.text ? `: ${a.text}` : ''}`,
      estimated: false,
    });
  }
  return items.sort((x, y) => x.siteTimeMs - y.siteTimeMs);
}
