import { formatRelease, formatSiteTime } from '@stillwell/shared/notices';
import type { AckOutcome } from './acknowledgements.service';

const escape = (s: string) =>
  s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );

/** A plain page, readable on any phone, with nothing to load from elsewhere. */
function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escape(title)}</title>
<style>body{font:18px/1.5 system-ui,sans-serif;max-width:36em;margin:2em auto;padding:0 1em;color:#111}h1{font-size:1.4em}</style>
</head><body><h1>${escape(title)}</h1>${body}</body></html>`;
}

export function acknowledgedPage(o: AckOutcome): string {
  const when = formatSiteTime(o.acknowledgedAt, o.timeZone);
  const first = o.recorded
    ? `<p>Thank you, ${escape(o.person)}. Your acknowledgement was recorded at ${escape(when)}.</p>`
    : `<p>${escape(o.person)}, this notice was already acknowledged at ${escape(when)}. Nothing more is needed.</p>`;
  return page(
    'Release notice acknowledged',
    `${first}<p>Release of about ${escape(formatRelease(o.releaseM3s))}, expected at ${escape(o.zoneName)} at about ${escape(formatSiteTime(o.arrivalAt, o.timeZone))}.</p>
<p>If anything about this release worries you, call the dam's control room.</p>`,
  );
}

export function refusedPage(reason: 'malformed' | 'forged' | 'expired' | 'unknown'): string {
  const why =
    reason === 'expired'
      ? 'This acknowledgement link has expired.'
      : 'This acknowledgement link is not valid. It may have been copied incompletely.';
  return page(
    'Acknowledgement not recorded',
    `<p>${why} Nothing has been recorded.</p><p>Please call the dam's control room to acknowledge the notice.</p>`,
  );
}
