import { canonicalize } from 'json-canonicalize';
import type { LogbookEntry } from '@stillwell/shared/logbook';

export const CSV_HEADER = [
  'seq',
  'time',
  'kind',
  'actor',
  'roles',
  'controls',
  'payload',
  'prev_hash',
  'hash',
];

/**
 * One CSV field (RFC 4180: quoted, quotes doubled). A field a spreadsheet would run as a formula
 * (= + - @ or a control character first) gets a leading apostrophe (OWASP, CSV injection). The
 * payload column is the canonical JSON that was hashed: it starts with "{", so it is never
 * touched, and a reviewer can recompute every hash from the file.
 */
export function csvField(value: string): string {
  const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return `"${safe.replace(/"/g, '""')}"`;
}

export function csvLine(e: LogbookEntry): string {
  const controls = Array.isArray(e.payload.controls)
    ? (e.payload.controls as unknown[]).join(' ')
    : '';
  return (
    [
      String(e.seq),
      e.time,
      e.kind,
      e.actorName ?? '',
      e.actorRoles.join(' '),
      controls,
      canonicalize(e.payload),
      e.prevHash,
      e.hash,
    ]
      .map(csvField)
      .join(',') + '\r\n'
  );
}
