import { CAP_NAMESPACE, type CapAlert, type CapInfo } from '@stillwell/shared/notices';

const escapeXml = (s: string) =>
  s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c]!,
  );

const el = (name: string, value: string | undefined, pad: string) =>
  value === undefined ? [] : [`${pad}<${name}>${escapeXml(value)}</${name}>`];

/** <info> with its elements in the order the CAP 1.2 XML schema's sequence requires. */
function infoXml(info: CapInfo, pad: string): string[] {
  const p = `${pad}  `;
  return [
    `${pad}<info>`,
    ...el('language', info.language, p),
    ...info.category.flatMap((c) => el('category', c, p)),
    ...el('event', info.event, p),
    ...info.responseType.flatMap((r) => el('responseType', r, p)),
    ...el('urgency', info.urgency, p),
    ...el('severity', info.severity, p),
    ...el('certainty', info.certainty, p),
    ...el('onset', info.onset, p),
    ...el('expires', info.expires, p),
    ...el('senderName', info.senderName, p),
    ...el('headline', info.headline, p),
    ...el('description', info.description, p),
    ...el('instruction', info.instruction, p),
    ...info.parameter.flatMap((x) => [
      `${p}<parameter>`,
      ...el('valueName', x.valueName, `${p}  `),
      ...el('value', x.value, `${p}  `),
      `${p}</parameter>`,
    ]),
    ...info.area.flatMap((a) => [
      `${p}<area>`,
      ...el('areaDesc', a.areaDesc, `${p}  `),
      `${p}</area>`,
    ]),
    `${pad}</info>`,
  ];
}

/** One <alert> element (OASIS CAP 1.2), without the XML declaration. */
export function alertElement(alert: CapAlert, pad = ''): string {
  const p = `${pad}  `;
  return [
    `${pad}<alert xmlns="${CAP_NAMESPACE}">`,
    ...el('identifier', alert.identifier, p),
    ...el('sender', alert.sender, p),
    ...el('sent', alert.sent, p),
    ...el('status', alert.status, p),
    ...el('msgType', alert.msgType, p),
    ...el('scope', alert.scope, p),
    ...el('note', alert.note, p),
    ...alert.info.flatMap((i) => infoXml(i, p)),
    `${pad}</alert>`,
  ].join('\n');
}

/** A standalone CAP 1.2 document. */
export function alertDocument(alert: CapAlert): string {
  return `<?xml version="1.0" encoding="UTF-8"?>\n${alertElement(alert)}\n`;
}

export interface AtomFeed {
  id: string;
  title: string;
  /** RFC 3339 */
  updated: string;
  selfUrl: string;
  author: string;
  entries: Array<{ alert: CapAlert; url: string; updated: string }>;
}

/**
 * The feed of active alerts: Atom (RFC 4287), each entry carrying its whole CAP 1.2 alert as
 * application/cap+xml content and linking to the standalone document, the way alert aggregators
 * read CAP feeds.
 */
export function atomFeed(feed: AtomFeed): string {
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<feed xmlns="http://www.w3.org/2005/Atom">',
    ...el('id', feed.id, '  '),
    ...el('title', feed.title, '  '),
    ...el('updated', feed.updated, '  '),
    `  <link rel="self" href="${escapeXml(feed.selfUrl)}"/>`,
    `  <author><name>${escapeXml(feed.author)}</name></author>`,
  ];
  for (const e of feed.entries) {
    lines.push(
      '  <entry>',
      ...el('id', `urn:stillwell:cap:${e.alert.identifier}`, '    '),
      ...el(
        'title',
        e.alert.info[0]?.headline ?? e.alert.info[0]?.event ?? e.alert.identifier,
        '    ',
      ),
      ...el('updated', e.updated, '    '),
      `    <link rel="alternate" type="application/cap+xml" href="${escapeXml(e.url)}"/>`,
      '    <content type="application/cap+xml">',
      alertElement(e.alert, '      '),
      '    </content>',
      '  </entry>',
    );
  }
  lines.push('</feed>', '');
  return lines.join('\n');
}
