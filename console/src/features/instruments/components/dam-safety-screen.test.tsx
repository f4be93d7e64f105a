import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import type { DamSafety } from '@stillwell/shared/alarms';
import { makeAlarmList } from '../../../testing/alarm-fixtures';
import { definition, makeStatus, SITE_NOW } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';
import { stubFetch } from '../../../testing/stub-fetch';

vi.mock('uplot', async () => ({
  default: (await import('../../../testing/fake-uplot')).FakeUPlot,
}));

const base = `/api/reservoirs/${definition.id}`;
const H = 3_600_000;
const [left, right] = definition.seepageWeirs!;
const p1 = definition.piezometers![0]!;
const times = [SITE_NOW - 48 * H, SITE_NOW - 24 * H, SITE_NOW - H];

const DAM: DamSafety = {
  reservoirId: definition.id,
  definitionVersion: 4,
  fromMs: SITE_NOW - 72 * H,
  toMs: SITE_NOW,
  pool: { channel: 'pool.radar', t: times, v: [204.5, 205, 206] },
  weirs: [
    {
      weir: left!,
      t: times,
      head: [0.1, 0.11, 0.2],
      flow: [0.005, 0.0054, 0.0247],
      pool: [204.5, 205, 206],
      baseline: [0.005, 0.0051, null],
      limit: [0.0075, 0.0076, null],
      curve: [
        { pool: 203, flow: 0.0045 },
        { pool: 207, flow: 0.006 },
      ],
    },
    { weir: right!, t: [], head: [], flow: [], pool: [], baseline: [], limit: [], curve: [] },
  ],
  piezometers: [
    {
      piezometer: p1,
      t: times,
      level: [192, 192.3, 192.9],
      pool: [204.5, 205, 206],
      baseline: [192, 192.3, 192.8],
      curve: [
        { pool: 203, level: 191.6 },
        { pool: 207, level: 193.8 },
      ],
    },
  ],
  massBalance: {
    fromMs: SITE_NOW - 3 * H,
    toMs: SITE_NOW,
    measuredChange: -10_000,
    predictedChange: 30_000,
    residualFlow: -3.7,
    meanThroughflow: 60,
    tolerance: 2.2,
    gauges: 2,
  },
};

describe('dam-safety screen', () => {
  it('plots seepage against the pool shaded by date, with baseline and limit, and says the flow', async () => {
    const { calls } = stubFetch({
      [base]: { version: 4, definition },
      [`${base}/status`]: makeStatus(),
      [`${base}/alarms`]: makeAlarmList([]),
      [`${base}/dam-safety`]: DAM,
    });
    renderApp(`/reservoirs/${definition.id}/dam-safety`);
    const scatter = await screen.findByRole('img', {
      name: 'Left abutment weir: seepage against pool elevation',
    });
    const points = within(scatter as unknown as HTMLElement).getAllByTestId('scatter-point');
    // shaded over the record there is (48 h of the 72 asked for): the oldest faint, the newest bright
    expect(points.map((p) => p.getAttribute('data-recency'))).toEqual(['0.00', '0.50', '0.98']);
    expect(Number(points[0]!.getAttribute('fill-opacity'))).toBeLessThan(
      Number(points[2]!.getAttribute('fill-opacity')),
    );
    expect(within(scatter as unknown as HTMLElement).getByTestId('scatter-baseline')).toBeTruthy();
    expect(within(scatter as unknown as HTMLElement).getByTestId('scatter-limit')).toBeTruthy();
    // 0.0247 m3/s at h = 0.2 m (V-notch) is 24.7 l/s, above the 15 l/s limit
    expect(screen.getByTestId('weir-latest-weir-left').textContent).toBe('24.7 l/s');
    expect(screen.getByTestId('weir-latest-weir-right').textContent).toBe('no readings');
    expect(screen.getByTestId('piezometer-latest-p1').textContent).toBe('192.9 m');
    expect(screen.getByTestId('mass-balance').textContent).toMatch(
      /-3\.70 m³\/s unaccounted for \(leaving\), tolerance 2\.20/,
    );
    expect(screen.getByRole('img', { name: 'Left abutment weir: seepage over time' })).toBeTruthy();
    expect(calls.find((u) => u.pathname.endsWith('/dam-safety'))?.searchParams.get('days')).toBe(
      '7',
    );
  });

  it('shows seepage in US gallons per minute in US customary units', async () => {
    stubFetch({
      [base]: { version: 4, definition },
      [`${base}/status`]: makeStatus(),
      [`${base}/alarms`]: makeAlarmList([]),
      [`${base}/dam-safety`]: DAM,
    });
    renderApp(`/reservoirs/${definition.id}/dam-safety`);
    await screen.findByTestId('weir-latest-weir-left');
    await userEvent.click(screen.getByRole('button', { name: 'US customary units' }));
    // 24.7 l/s = 391.5 US gal/min (NIST SP 811: 1 gal = 3.785411784 l)
    expect(screen.getByTestId('weir-latest-weir-left').textContent).toBe('392 gpm');
  });
});
