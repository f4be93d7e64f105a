import {
  PRIORITY_INFO,
  type AlarmEventKind,
  type AlarmView,
  type ConditionKind,
  type DisplayState,
  type Priority,
} from '@stillwell/shared/alarms';
import { formatAge, formatNumber, formatSiteTime } from '../../../lib/format';

/** ISA-18.2's state names, as the list shows them. */
export const STATE_TEXT: Readonly<Record<DisplayState, string>> = {
  unacknowledged: 'Active, unacknowledged',
  acknowledged: 'Active, acknowledged',
  'cleared-unacknowledged': 'Cleared, unacknowledged',
  normal: 'Cleared, acknowledged',
  shelved: 'Shelved',
  'out-of-service': 'Out of service',
};

export const EVENT_TEXT: Readonly<Record<AlarmEventKind, string>> = {
  raised: 'Raised',
  cleared: 'Cleared',
  acknowledged: 'Acknowledged',
  shelved: 'Shelved',
  'shelf-expired': 'Shelf ran out',
  'removed-from-service': 'Taken out of service',
  'returned-to-service': 'Returned to service',
};

export function priorityLabel(p: Priority): string {
  return PRIORITY_INFO[p].label;
}

/** A site time as "14:05:09 GMT, Tue 3 Mar". */
export function siteStamp(ms: number | null, timeZone: string): string {
  if (ms === null) return '—';
  const t = formatSiteTime(ms, timeZone);
  return `${t.time} ${t.zone}, ${t.date}`;
}

/** Conditions whose value is a time in site seconds (how long silent, still, or left to act). */
const SECONDS_KINDS: ReadonlySet<ConditionKind> = new Set([
  'channel-stale',
  'telemetry-silent',
  'channel-frozen',
  'time-left',
]);

/** The value against its limit in the alarm's own unit (SI), or nothing where there is none. */
export function valueText(a: Pick<AlarmView, 'kind' | 'value' | 'limit' | 'unit'>): string {
  if (a.value === null) return '';
  if (a.unit === null && SECONDS_KINDS.has(a.kind)) {
    const v = formatAge(a.value);
    return a.limit === null ? v : `${v} (limit ${formatAge(a.limit)})`;
  }
  if (a.kind === 'out-of-range-burst') return `${formatNumber(a.value, 0)} out of range`;
  // small flows (seepage) read in litres per second
  const litres = a.unit === 'm3/s' && Math.abs(a.value) < 1 && Math.abs(a.limit ?? 0) < 1;
  const scale = litres ? 1000 : 1;
  const unit = litres ? 'l/s' : (a.unit ?? '');
  const digits = litres ? 1 : unit === 'm/h' ? 3 : 2;
  const v = `${formatNumber(a.value * scale, digits)} ${unit}`.trim();
  return a.limit === null
    ? v
    : `${v} (limit ${formatNumber(a.limit * scale, digits)} ${unit})`.trim();
}
