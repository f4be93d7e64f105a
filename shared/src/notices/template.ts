import { CUBIC_FOOT_M3 } from '../units/units.js';

/**
 * Plain-language notice text from a template the liaison can edit. Placeholders are {{name}}; the
 * list is closed so that a typo is caught when the template is saved, not when a town reads
 * "{{arival}}" in its inbox. The figures block and the acknowledgement link are not part of the
 * template: they are added to every message as they are, so no edit can drop them.
 */
export const TEMPLATE_FIELDS = {
  organisation: "the contact's organisation",
  person: "the contact's name",
  zone: 'the zone',
  distance: 'the distance of the zone below the dam',
  release: 'the expected release',
  start: 'when the release starts at the dam',
  arrival: 'when the rise is expected to reach the zone',
  duration: 'how long the high flow lasts at the zone',
  dam: 'the dam',
  river: 'the river',
} as const;
export type TemplateField = keyof typeof TEMPLATE_FIELDS;
export type TemplateValues = Record<TemplateField, string>;

const PLACEHOLDER = /\{\{\s*([^{}]*?)\s*\}\}/g;

export const DEFAULT_NOTICE_TEMPLATE = [
  'To {{person}}, {{organisation}}:',
  '',
  '{{dam}} is going to raise its release into the {{river}} to about {{release}}, starting {{start}}.',
  'The rise is expected to reach {{zone}} ({{distance}} below the dam) at about {{arrival}} and to last {{duration}}.',
  '',
  'Please keep people, vehicles and equipment clear of the river banks at {{zone}} until you are told the release has ended.',
].join('\n');

export const DEFAULT_NOTICE_SUBJECT =
  'Release notice: {{dam}} to about {{release}}, reaching {{zone}} {{arrival}}';

/** Every problem with a template, or none: unknown placeholders and unbalanced braces. */
export function templateProblems(template: string): string[] {
  const problems: string[] = [];
  for (const match of template.matchAll(PLACEHOLDER)) {
    const name = match[1] ?? '';
    if (!(name in TEMPLATE_FIELDS)) {
      problems.push(
        `unknown placeholder {{${name}}} (known: ${Object.keys(TEMPLATE_FIELDS).join(', ')})`,
      );
    }
  }
  const rest = template.replace(PLACEHOLDER, '');
  if (rest.includes('{{') || rest.includes('}}'))
    problems.push('a "{{" or "}}" without its other half');
  return problems;
}

/** Fills a template; refuses one with problems rather than sending half-filled text. */
export function renderTemplate(template: string, values: TemplateValues): string {
  const problems = templateProblems(template);
  if (problems.length) throw new Error(`template: ${problems.join('; ')}`);
  return template.replace(PLACEHOLDER, (_all, name: string) => values[name as TemplateField]);
}

/** "1 h 30 min", "45 min", "2 d 3 h": durations as a person reads them. */
export function formatDuration(seconds: number): string {
  const minutes = Math.round(seconds / 60);
  if (minutes < 60) return `${minutes} min`;
  const days = Math.floor(minutes / 1440);
  const hours = Math.floor((minutes % 1440) / 60);
  const mins = minutes % 60;
  const parts = [days && `${days} d`, hours && `${hours} h`, mins && `${mins} min`].filter(Boolean);
  return parts.join(' ');
}

/** "Tue 1 Dec 2026, 14:05 GMT": a site time in the site's own zone, with the zone's name. */
export function formatSiteTime(epochMs: number, timeZone: string): string {
  // assembled from parts: the locale's own punctuation differs between ICU versions
  const parts = new Intl.DateTimeFormat('en-GB', {
    timeZone,
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    timeZoneName: 'short',
  }).formatToParts(new Date(epochMs));
  const get = (type: Intl.DateTimeFormatPartTypes) =>
    parts.find((p) => p.type === type)?.value ?? '';
  return `${get('weekday')} ${get('day')} ${get('month')} ${get('year')}, ${get('hour')}:${get('minute')} ${get('timeZoneName')}`;
}

/** "850 m3/s (30,017 cfs)": SI first, US customary beside it for readers used to it. */
export function formatRelease(m3s: number): string {
  const cfs = m3s / CUBIC_FOOT_M3;
  const fmt = (n: number) => Math.round(n).toLocaleString('en-GB');
  return `${fmt(m3s)} m3/s (${fmt(cfs)} cfs)`;
}

/** "1.5 km", "800 m". */
export function formatDistance(metres: number): string {
  return metres >= 1000
    ? `${(metres / 1000).toFixed(1).replace(/\.0$/, '')} km`
    : `${Math.round(metres)} m`;
}
