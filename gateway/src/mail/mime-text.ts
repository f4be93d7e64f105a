/**
 * Just enough of RFC 5322 / MIME (RFC 2045-2047) to show the demo outbox a message our own sender
 * wrote: the headers, the encoded-word Subject, and the text/plain body in quoted-printable, base64
 * or 7/8bit. The tests read the same messages with mailparser, so this only has to be right for us.
 */
export interface MimeText {
  headers: Map<string, string>;
  subject: string;
  text: string;
}

function splitHead(raw: string): { head: string; body: string } {
  const i = raw.search(/\r?\n\r?\n/);
  if (i < 0) return { head: raw, body: '' };
  const sep = raw.slice(i).startsWith('\r\n\r\n') ? 4 : 2;
  return { head: raw.slice(0, i), body: raw.slice(i + sep) };
}

function parseHeaders(head: string): Map<string, string> {
  const headers = new Map<string, string>();
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ');
  for (const line of unfolded.split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon > 0)
      headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  return headers;
}

function decodeQuotedPrintable(text: string): string {
  const bytes: number[] = [];
  const soft = text.replace(/=\r?\n/g, '');
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i]!;
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(soft.slice(i + 1, i + 3))) {
      bytes.push(parseInt(soft.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(...Buffer.from(c, 'utf8'));
  }
  return Buffer.from(bytes).toString('utf8');
}

function decodeBody(body: string, encoding: string | undefined): string {
  switch ((encoding ?? '7bit').toLowerCase()) {
    case 'quoted-printable':
      return decodeQuotedPrintable(body);
    case 'base64':
      return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
    default:
      return body;
  }
}

/** RFC 2047 encoded words, as nodemailer writes a non-ASCII or long Subject. */
export function decodeWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(
      /=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g,
      (_all, _charset: string, kind: string, data: string) =>
        kind.toUpperCase() === 'B'
          ? Buffer.from(data, 'base64').toString('utf8')
          : decodeQuotedPrintable(data.replace(/_/g, ' ')),
    );
}

function textOf(headers: Map<string, string>, body: string): string {
  const type = headers.get('content-type') ?? 'text/plain';
  const boundary = /boundary="?([^";]+)"?/i.exec(type)?.[1];
  if (/^multipart\//i.test(type) && boundary) {
    for (const part of body.split(`--${boundary}`).slice(1)) {
      if (part.startsWith('--')) break;
      const { head, body: partBody } = splitHead(part.replace(/^\r?\n/, ''));
      const partHeaders = parseHeaders(head);
      const found = textOf(partHeaders, partBody.replace(/\r?\n$/, ''));
      if (found) return found;
    }
    return '';
  }
  if (!/^text\/plain/i.test(type)) return '';
  // the line end that closes the body is the message's, not the text's
  return decodeBody(body, headers.get('content-transfer-encoding'))
    .replace(/\r\n/g, '\n')
    .replace(/\n$/, '');
}

export function readMimeText(raw: string): MimeText {
  const { head, body } = splitHead(raw);
  const headers = parseHeaders(head);
  return {
    headers,
    subject: decodeWords(headers.get('subject') ?? ''),
    text: textOf(headers, body),
  };
}
