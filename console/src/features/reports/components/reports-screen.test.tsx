import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import {
  eventReportSchema,
  type EventReport,
  type ReportJob,
  type ReportStage,
} from '@stillwell/shared/reports';
import { definition, makeStatus, SITE_NOW } from '../../../testing/fixtures';
import { makeMe, stubApi, type Call } from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

const base = `/api/reservoirs/${definition.id}`;
const REPORTS = `/reservoirs/${definition.id}/reports`;
const HOUR = 3_600_000;
// the demo reservoir's site is in Europe/London: GMT in March
const FROM = SITE_NOW - 72 * HOUR;
const TO = SITE_NOW;

const job = (stage: ReportStage, percent: number, rows: ReportJob['rows'] = null): ReportJob => ({
  id: 'job-1',
  reservoirId: definition.id,
  from: new Date(FROM).toISOString(),
  to: new Date(TO).toISOString(),
  formats: ['pdf', 'json', 'csv'],
  stage,
  percent,
  rows,
  error: null,
  createdAt: new Date(SITE_NOW).toISOString(),
  finishedAt: stage === 'done' ? new Date(SITE_NOW).toISOString() : null,
});

const report: EventReport = eventReportSchema.parse({
  reservoirId: definition.id,
  reservoirName: definition.name,
  from: FROM,
  to: TO,
  generatedAt: new Date(SITE_NOW).toISOString(),
  demo: true,
  caution: 'decision support',
  thresholds: [],
  summary: {
    poolChannel: 'pool.radar',
    inflowChannel: 'inflow',
    outflowChannel: 'outflow',
    peakPool: { channel: 'pool.radar', value: 208.4321, t: FROM + 30 * HOUR },
    peakInflow: { channel: 'inflow', value: 1234.56, t: FROM + 26 * HOUR },
    // the outflow's highest reading is the window's last: the window stopped, not the outflow
    peakOutflow: { channel: 'outflow', value: 610.04, t: TO - 5 * 60_000 },
    maxRateOfRise: { value: 0.21, t: FROM + 20 * HOUR },
    readingCount: 1000,
    suspectCount: 0,
    badCount: 0,
  },
  forecasts: [],
  orders: [],
  notices: [],
  alarms: { raised: 3, acknowledged: 2, medianToAck: 90_000, byCondition: [] },
  logbook: {
    ok: true,
    count: 41,
    headSeq: 41,
    headHash: 'ab'.repeat(32),
    checkedAt: new Date(SITE_NOW).toISOString(),
    problem: null,
  },
  charts: { pool: [], inflow: [], outflow: [] },
});

function gateway(over: Record<string, unknown> = {}) {
  return stubApi({
    'GET /api/reservoirs': [
      {
        id: definition.id,
        name: definition.name,
        damName: definition.damName,
        timeZone: definition.timeZone,
        version: 3,
      },
    ],
    [`GET ${base}`]: { version: 3, definition },
    [`GET ${base}/status`]: makeStatus(),
    'GET /api/auth/me': makeMe('engineer', {
      roles: ['reviewer'],
      permissions: ['reports.create', 'replay.read', 'logbook.read', 'logbook.verify'],
    }),
    [`GET ${base}/reports/demo-window`]: {
      from: new Date(FROM).toISOString(),
      to: new Date(TO).toISOString(),
    },
    [`POST ${base}/reports`]: job('queued', 0),
    // the job as the gateway reports it on each poll: under way, writing the CSV, then done
    [`GET ${base}/reports/job-1`]: (_: Call, n: number) =>
      n === 1
        ? job('readings', 30)
        : n === 2
          ? job('csv', 70, { done: 500, total: 1000 })
          : job('done', 100),
    [`GET ${base}/reports/job-1/result`]: report,
    ...over,
  });
}

describe('the reports screen', () => {
  it('starts the demo storm report, follows its progress to the end and shows the figures', async () => {
    const calls = gateway();
    renderApp(REPORTS);
    expect((await screen.findByTestId('report-caution')).textContent).toMatch(
      /emergency action plan, local codes and the responsible licensed engineer prevail/,
    );
    const demo = await screen.findByTestId('report-demo-window');
    await waitFor(() => expect((demo as HTMLButtonElement).disabled).toBe(false));
    await userEvent.click(demo);
    // the fields hold the site's wall clock (GMT in March: the same as UTC)
    expect((screen.getByTestId('report-from') as HTMLInputElement).value).toBe(
      new Date(FROM).toISOString().slice(0, 16),
    );
    await userEvent.click(screen.getByTestId('report-start'));

    await waitFor(() =>
      expect(calls.find((c) => c.method === 'POST')).toEqual({
        method: 'POST',
        path: `${base}/reports`,
        body: {
          from: new Date(FROM).toISOString(),
          to: new Date(TO).toISOString(),
          formats: ['pdf', 'json', 'csv'],
        },
      }),
    );
    const text = () => screen.getByTestId('report-progress-text').textContent;
    const bar = () => Number(screen.getByRole('progressbar').getAttribute('aria-valuenow'));
    await waitFor(() => expect(text()).toBe('Reading the gauges · 30%'));
    expect(bar()).toBe(30);
    await waitFor(() => expect(text()).toBe('Writing the CSV · 70% · 500 of 1,000 rows written'), {
      timeout: 3000,
    });
    expect(bar()).toBe(70);
    await waitFor(() => expect(text()).toBe('Ready · 100%'), { timeout: 3000 });

    expect((await screen.findByTestId('report-peak-pool')).textContent).toBe('208.43');
    expect(screen.getByTestId('report-peak-inflow').textContent).toBe('1,234.6');
    expect(screen.getByTestId('report-max-rise').textContent).toBe('+0.210');
    const laterNote = /at the window's end: the peak may come later/;
    expect(screen.getByRole('region', { name: 'Peak outflow' }).textContent).toMatch(laterNote);
    expect(screen.getByRole('region', { name: 'Peak pool' }).textContent).not.toMatch(laterNote);
    expect(screen.getByTestId('report-head-hash').textContent).toContain('ab'.repeat(32));
    expect(screen.getByTestId('report-alarm-counts').textContent).toMatch(
      /^3 raised, 2 acknowledged/,
    );
    for (const f of ['pdf', 'json', 'csv'])
      expect(screen.getByTestId(`report-download-${f}`)).toBeTruthy();
    // polling stopped at done: no more asks after the figures came
    const polls = calls.filter((c) => c.path === `${base}/reports/job-1`).length;
    await new Promise((r) => setTimeout(r, 900));
    expect(calls.filter((c) => c.path === `${base}/reports/job-1`).length).toBe(polls);
  }, 20_000);

  it("shows the gateway's 400 naming the field, and starts no job", async () => {
    const calls = gateway({
      [`POST ${base}/reports`]: Response.json(
        {
          statusCode: 400,
          message: 'to: the window may be at most 31 days long',
          error: 'Bad Request',
        },
        { status: 400 },
      ),
    });
    renderApp(REPORTS);
    fireEvent.change(await screen.findByTestId('report-from'), {
      target: { value: '2026-01-01T00:00' },
    });
    fireEvent.change(screen.getByTestId('report-to'), { target: { value: '2026-03-01T00:00' } });
    await userEvent.click(screen.getByTestId('report-start'));
    const alert = await screen.findByTestId('report-error');
    expect(alert.textContent).toContain('to: the window may be at most 31 days long');
    expect(alert.textContent).toContain('HTTP 400');
    expect(calls.some((c) => c.path.startsWith(`${base}/reports/job`))).toBe(false);
    expect(screen.queryByTestId('report-progress')).toBeNull();
  });

  it('refuses a window that ends before it starts, naming the field, before asking the gateway', async () => {
    const calls = gateway();
    renderApp(REPORTS);
    fireEvent.change(await screen.findByTestId('report-from'), {
      target: { value: '2026-03-03T10:00' },
    });
    fireEvent.change(screen.getByTestId('report-to'), { target: { value: '2026-03-03T09:00' } });
    await userEvent.click(screen.getByTestId('report-start'));
    expect(await screen.findByText('To: must be after From')).toBeTruthy();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
  });

  it('says why a job failed', async () => {
    gateway({
      [`GET ${base}/reports/job-1`]: { ...job('failed', 40), error: 'database is locked' },
    });
    renderApp(`${REPORTS}?job=job-1`);
    const failed = await screen.findByTestId('report-failed');
    expect(within(failed).getByText(/database is locked/)).toBeTruthy();
  });
});
