import type { Content, TableCell } from 'pdfmake/interfaces';
import type { EventReport } from '@stillwell/shared/reports';
import { durationText } from '../site-time-format';

export type TimeText = (ms: number) => string;

const m = (v: number | null | undefined, digits = 2) => (v == null ? '—' : v.toFixed(digits));
const head = (cells: string[]): TableCell[] => cells.map((text) => ({ text, style: 'th' }));

export function table(
  widths: Array<string | number>,
  header: string[],
  rows: TableCell[][],
): Content {
  return {
    table: { headerRows: 1, widths, body: [head(header), ...rows], dontBreakRows: true },
    layout: 'lightHorizontalLines',
    margin: [0, 2, 0, 8],
  };
}

export function summarySection(r: EventReport, time: TimeText): Content[] {
  const s = r.summary;
  const peak = (p: EventReport['summary']['peakPool'], unit: string, digits: number) =>
    p ? [`${m(p.value, digits)} ${unit}`, time(p.t), p.channel] : ['—', '—', '—'];
  return [
    { text: 'What happened', style: 'h2' },
    table(
      ['*', 'auto', 'auto', 'auto'],
      ['figure', 'value', 'when', 'gauge'],
      [
        ['Peak pool', ...peak(s.peakPool, 'm', 3)],
        ['Peak inflow', ...peak(s.peakInflow, 'm³/s', 1)],
        ['Peak outflow', ...peak(s.peakOutflow, 'm³/s', 1)],
        [
          'Largest rate of rise (30-min slope)',
          s.maxRateOfRise ? `${m(s.maxRateOfRise.value, 3)} m/h` : '—',
          s.maxRateOfRise ? time(s.maxRateOfRise.t) : '—',
          s.poolChannel ?? '—',
        ],
      ],
    ),
    {
      text:
        `${s.readingCount.toLocaleString('en')} readings in the window. Figures use readings not ` +
        `marked bad; among the pool, inflow and outflow readings ${s.suspectCount} were suspect ` +
        `and ${s.badCount} bad (left out).`,
      style: 'note',
    },
  ];
}

export function forecastSection(r: EventReport, time: TimeText): Content[] {
  const rows = r.forecasts.map((f): TableCell[] => [
    `${f.leadHours} h before`,
    f.computedAt === null ? 'no stored run' : time(f.computedAt),
    f.forecastPeak === null ? '—' : `${m(f.forecastPeak, 3)} m`,
    f.forecastP90 === null ? '—' : `${m(f.forecastP90, 3)} m`,
    f.error === null ? '—' : `${f.error >= 0 ? '+' : ''}${m(f.error, 3)} m`,
    f.timingError === null ? '—' : durationText(f.timingError),
  ]);
  return [
    { text: 'Forecasts against what happened', style: 'h2' },
    table(
      ['auto', '*', 'auto', 'auto', 'auto', 'auto'],
      ['ahead of the peak', 'run computed', 'forecast peak', 'p90', 'error', 'timing error'],
      rows,
    ),
    {
      text:
        'Each row is the newest stored forecast run computed at or before that mark (within the ' +
        'hour before it), as operators saw it. Error = forecast peak − actual peak; timing error = ' +
        'forecast peak time − actual peak time.',
      style: 'note',
    },
  ];
}

export function decisionSection(r: EventReport, time: TimeText): Content[] {
  const out: Content[] = [{ text: 'Gate orders, from draft to confirmation', style: 'h2' }];
  if (!r.orders.length) out.push({ text: 'No gate orders in the window.', style: 'note' });
  for (const o of r.orders) {
    out.push({
      text: [
        { text: `Order ${o.orderId}`, bold: true },
        ` (${o.state}${o.emergency ? ', under a declared emergency' : ''}): ${o.reason}. `,
        o.draftToConfirmation === null
          ? 'Not confirmed in position.'
          : `Draft to confirmation: ${durationText(o.draftToConfirmation)}.`,
      ],
      style: 'body',
      margin: [0, 4, 0, 0],
    });
    out.push(
      table(
        ['auto', '*', 'auto', 'auto', 'auto'],
        ['step', 'site time', 'by', 'since previous', 'logbook #'],
        o.steps.map((s) => [
          s.kind,
          time(s.t),
          s.actor ?? 'gateway',
          s.sincePrevious === null ? '—' : durationText(s.sincePrevious),
          String(s.logbookSeq),
        ]),
      ),
    );
  }
  return out;
}

export function noticeSection(r: EventReport, time: TimeText): Content[] {
  const rows = r.notices.map((n): TableCell[] => [
    n.zoneName,
    n.contactName,
    n.sentAt === null ? 'not sent' : time(n.sentAt),
    durationText(n.neededS * 1000),
    n.gotS === null ? '—' : durationText(n.gotS * 1000),
    { text: n.short ? 'SHORT' : 'met', bold: n.short, color: n.short ? '#b71c1c' : '#1b5e20' },
  ]);
  return [
    { text: 'Downstream notices: lead time needed and got', style: 'h2' },
    r.notices.length
      ? table(
          ['*', '*', 'auto', 'auto', 'auto', 'auto'],
          ['zone', 'contact', 'sent', 'needed', 'got', ''],
          rows,
        )
      : { text: 'No notices in the window.', style: 'note' },
    {
      text: 'Lead time got = start of the release (the order’s execution, else its planned start) − when the message went to the mail server.',
      style: 'note',
    },
  ];
}

export function alarmSection(r: EventReport): Content[] {
  const a = r.alarms;
  const rows = a.byCondition.map((c): TableCell[] => [
    c.label,
    c.priority,
    String(c.raised),
    String(c.acknowledged),
    c.medianToAck === null ? '—' : durationText(c.medianToAck),
    c.maxToAck === null ? '—' : durationText(c.maxToAck),
  ]);
  return [
    { text: 'Alarms', style: 'h2' },
    {
      text:
        `${a.raised} raised, ${a.acknowledged} acknowledged in the window` +
        (a.medianToAck === null
          ? '.'
          : `; median time to acknowledge ${durationText(a.medianToAck)}.`),
      style: 'body',
    },
    ...(rows.length
      ? [
          table(
            ['*', 'auto', 'auto', 'auto', 'auto', 'auto'],
            ['alarm', 'priority', 'raised', 'acknowledged', 'median to ack', 'longest'],
            rows,
          ),
        ]
      : []),
  ];
}

export function logbookSection(r: EventReport): Content[] {
  const l = r.logbook;
  return [
    { text: 'Logbook verification', style: 'h2' },
    {
      text: l.ok
        ? `The whole chain verified: ${l.count} entries, none altered or missing (checked ${l.checkedAt}).`
        : `VERIFICATION FAILED: ${l.problem ?? 'unknown problem'} (checked ${l.checkedAt}).`,
      style: 'body',
      color: l.ok ? '#1b5e20' : '#b71c1c',
      bold: !l.ok,
    },
    { text: `Head entry: #${l.headSeq ?? '—'}`, style: 'body' },
    { text: `Head hash: ${l.headHash ?? '—'}`, style: 'mono' },
  ];
}
