import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import type { EventReport } from '@stillwell/shared/reports';
import { svgChart } from '../charts/svg-chart';
import { siteTimeFormatter } from '../site-time-format';
import {
  alarmSection,
  decisionSection,
  forecastSection,
  logbookSection,
  noticeSection,
  summarySection,
} from './report-sections';

const RULE_COLOURS = ['#f9a825', '#ef6c00', '#d84315', '#c62828', '#6a1b9a'];

/** The charts as SVG strings: the pool with its thresholds, then inflow and outflow. */
export function reportCharts(r: EventReport, timeZone: string): { pool: string; flows: string } {
  const { short } = siteTimeFormatter(timeZone);
  const pool = svgChart({
    title: 'Pool elevation',
    unit: 'm',
    from: r.from,
    to: r.to,
    timeLabel: short,
    lines: [{ label: r.summary.poolChannel ?? 'pool', colour: '#1565c0', points: r.charts.pool }],
    rules: r.thresholds.map((t, i) => ({
      label: t.label,
      value: t.elevation,
      colour: RULE_COLOURS[i % RULE_COLOURS.length]!,
    })),
  });
  const flows = svgChart({
    title: 'Inflow and outflow',
    unit: 'm³/s',
    from: r.from,
    to: r.to,
    timeLabel: short,
    lines: [
      { label: 'Inflow', colour: '#2e7d32', points: r.charts.inflow },
      { label: 'Outflow', colour: '#6d4c41', points: r.charts.outflow },
    ],
  });
  return { pool, flows };
}

/** The PDF's document definition: caution first, then what happened, what was decided, who was told. */
export function reportDocument(r: EventReport, timeZone: string): TDocumentDefinitions {
  const { full } = siteTimeFormatter(timeZone);
  const charts = reportCharts(r, timeZone);
  const demo: Content[] = r.demo
    ? [
        {
          text:
            'Demo scenario: the storm, the readings and the people in this report are the ' +
            'invented Stillwell demonstration (Lake Orrin, Tamsel River), not a real event.',
          style: 'demo',
        },
      ]
    : [];
  return {
    info: { title: `Event report: ${r.reservoirName}`, creator: 'Stillwell' },
    pageSize: 'A4',
    pageMargins: [40, 48, 40, 48],
    defaultStyle: { font: 'Roboto', fontSize: 9 },
    header: (page) =>
      page > 1
        ? {
            text: `${r.reservoirName}: event report ${full(r.from)} to ${full(r.to)}`,
            style: 'running',
            margin: [40, 20, 40, 0],
          }
        : '',
    footer: (page, pages) => ({
      columns: [
        { text: 'Stillwell event report. Decision support only.', style: 'running' },
        { text: `page ${page} of ${pages}`, alignment: 'right', style: 'running' },
      ],
      margin: [40, 16, 40, 0],
    }),
    content: [
      { text: `Event report: ${r.reservoirName}`, style: 'h1' },
      {
        text: `Window ${full(r.from)} to ${full(r.to)} (site time, ${timeZone}). Generated ${r.generatedAt}.`,
        style: 'body',
      },
      ...demo,
      {
        table: { widths: ['*'], body: [[{ text: r.caution, style: 'caution' }]] },
        layout: { hLineColor: '#b71c1c', vLineColor: '#b71c1c' },
        margin: [0, 6, 0, 8],
      },
      ...summarySection(r, full),
      { svg: charts.pool, width: 515, margin: [0, 4, 0, 6] },
      { svg: charts.flows, width: 515, margin: [0, 0, 0, 6] },
      ...forecastSection(r, full),
      ...decisionSection(r, full),
      ...noticeSection(r, full),
      ...alarmSection(r),
      ...logbookSection(r),
    ],
    styles: {
      h1: { fontSize: 16, bold: true, margin: [0, 0, 0, 4] },
      h2: { fontSize: 11.5, bold: true, margin: [0, 8, 0, 3], color: '#0d47a1' },
      th: { bold: true, fontSize: 8.5, color: '#424242' },
      body: { fontSize: 9, margin: [0, 1, 0, 1] },
      note: { fontSize: 7.5, italics: true, color: '#616161', margin: [0, 0, 0, 4] },
      caution: { fontSize: 8.5, bold: true, color: '#b71c1c', margin: [4, 3, 4, 3] },
      demo: { fontSize: 9, bold: true, color: '#e65100', margin: [0, 4, 0, 0] },
      mono: { fontSize: 7.5, color: '#212121' },
      running: { fontSize: 7, color: '#757575' },
    },
  };
}
