import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import {
  FORECAST_CAUTION,
  type CompareRequest,
  type CompareResponse,
  type CompareSide,
} from '@stillwell/shared/forecasts';
import { definition, makeStatus, SITE_NOW } from '../../../testing/fixtures';
import { FakeUPlot } from '../../../testing/fake-uplot';
import { makeUpdate } from '../../../testing/forecast-fixtures';
import { stubApi, type Call } from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

vi.mock('uplot', async () => ({
  default: (await import('../../../testing/fake-uplot')).FakeUPlot,
}));

const base = `/api/reservoirs/${definition.id}`;
const COMPARE = `POST ${base}/forecasts/compare`;
const PAGE = `/reservoirs/${definition.id}/what-if`;

/** One side of a routed comparison whose pool peaks at `peak` m after 6 h. */
function side(label: string, peak: number): CompareSide {
  const t = [0, 3600, 21_600, 86_400];
  const elevation = [205, 206, peak, 205.5];
  return {
    label,
    series: { t, inflow: [300, 800, 1900, 300], elevation, outflow: [100, 400, 1500, 300] },
    summary: {
      peakElevation: peak,
      peakElevationTimeS: 21_600,
      peakOutflow: 1500,
      peakOutflowTimeS: 21_600,
      finalElevation: 205.5,
      releasedVolume: 9.7e7,
      maxReleaseRate: 1.1,
      thresholds: [],
      leftTableAtS: null,
    },
  };
}

function compared(body: CompareRequest): CompareResponse {
  const a = side(body.labelA, 207.62);
  const b = side(body.labelB, 207.94);
  return {
    startMs: SITE_NOW,
    startElevation: 205,
    initialOpenings: {},
    durationS: 86_400,
    dtS: 60,
    definitionVersion: 3,
    notes: ['free outfall: no tailwater is assumed'],
    caution: FORECAST_CAUTION,
    a,
    b,
    difference: {
      peakElevation: 0.32,
      peakElevationTimeS: 0,
      peakOutflow: 0,
      finalElevation: 0,
      releasedVolume: 0,
    },
  };
}

function stubGateway(compare: (call: Call) => unknown) {
  return stubApi({
    [`GET ${base}`]: { version: 3, definition },
    [`GET ${base}/status`]: makeStatus(),
    [`GET ${base}/forecasts/latest`]: makeUpdate(),
    [COMPARE]: compare,
  });
}

const posted = (calls: Call[]) =>
  calls.filter((c) => `${c.method} ${c.path}` === COMPARE).map((c) => c.body as CompareRequest);

/** Double-clicks a cell of the hydrograph grid, types a new value and commits it with Enter. */
async function editHydrographCell(row: number, column: 'hour' | 'flow', value: string) {
  const cell = screen
    .getByTestId('hydrograph-grid')
    .querySelector<HTMLElement>(`[data-rowindex="${row - 1}"] [data-field="${column}"]`)!;
  await userEvent.dblClick(cell);
  const input = await within(cell).findByRole('spinbutton');
  await userEvent.clear(input);
  await userEvent.type(input, `${value}{Enter}`);
}

// the data grid renders slowly in jsdom on a loaded machine: a limit for hangs, not a speed check
describe('the what-if page', { timeout: 90_000 }, () => {
  beforeEach(() => {
    FakeUPlot.instances.length = 0;
  });

  it('routes an edited hydrograph under two schedules and shows both side by side', async () => {
    const calls = stubGateway((c) => compared(c.body as CompareRequest));
    renderApp(PAGE);
    await screen.findByTestId('what-if-screen');
    expect(screen.getAllByTestId('forecast-caution')[0]!.textContent).toMatch(/Decision support/);

    await editHydrographCell(2, 'flow', '2500');
    await userEvent.clear(screen.getByTestId('schedule-b-name'));
    await userEvent.type(screen.getByTestId('schedule-b-name'), 'Hold for 3 h');
    await userEvent.click(screen.getByTestId('run-what-if'));

    const results = await screen.findByTestId('what-if-results');
    const [request] = posted(calls);
    // the edited row went out in seconds and m3/s, the others as they were
    expect(request!.inflow).toEqual([
      { t: 0, q: 300 },
      { t: 21_600, q: 2500 },
      { t: 86_400, q: 300 },
    ]);
    expect(request!.labelB).toBe('Hold for 3 h');
    expect(request!.scheduleA.length).toBeGreaterThan(0);
    expect(request!.scheduleB.length).toBeGreaterThan(0);

    const table = within(results).getByTestId('comparison');
    expect(within(table).getByTestId('comparison-label-b').textContent).toMatch(/Hold for 3 h/);
    expect(within(table).getByTestId('comparison-peak-a').textContent).toMatch(/207\.62/);
    const peakB = within(table).getByTestId('comparison-peak-b');
    expect(peakB.textContent).toMatch(/207\.94/);
    expect(peakB.getAttribute('data-worse')).toBe('true');
    // the routed pools are drawn, one line per schedule
    expect(FakeUPlot.instances.some((p) => p.opts.series.length >= 3)).toBe(true);
    expect(results.getAttribute('data-outdated')).toBe('false');

    // a change after the run marks the result as no longer the tables'
    await editHydrographCell(3, 'flow', '400');
    await waitFor(() => expect(results.getAttribute('data-outdated')).toBe('true'));
  });

  it('checks rows before sending, and shows the gateway’s 400 beside the row it names', async () => {
    const calls = stubGateway(() =>
      Response.json(
        {
          statusCode: 400,
          error: 'Bad Request',
          message: ['inflow row 2 (q): above what the spillway rating covers (9000 m3/s)'],
        },
        { status: 400 },
      ),
    );
    renderApp(PAGE);
    await screen.findByTestId('what-if-screen');

    // the shared row checks refuse a negative flow without asking the gateway
    await editHydrographCell(3, 'flow', '-5');
    await userEvent.click(screen.getByTestId('run-what-if'));
    expect((await screen.findByTestId('hydrograph-grid-problem-3')).textContent).toMatch(
      /Inflow: .*negative/,
    );
    expect(posted(calls)).toHaveLength(0);

    await editHydrographCell(3, 'flow', '300');
    await editHydrographCell(2, 'flow', '9000');
    await waitFor(() => expect(screen.queryByTestId('hydrograph-grid-problem-3')).toBeNull());
    await userEvent.click(screen.getByTestId('run-what-if'));

    const beside = await screen.findByTestId('hydrograph-grid-problem-2');
    expect(beside.textContent).toBe('Inflow: above what the spillway rating covers (9000 m3/s)');
    const listed = screen.getByRole('alert', { name: 'Problems in Inflow hydrograph' });
    expect(listed.textContent).toMatch(/inflow row 2 \(q\)/);
    expect(posted(calls)).toHaveLength(1);
    expect(screen.queryByTestId('what-if-results')).toBeNull();
  });
});
