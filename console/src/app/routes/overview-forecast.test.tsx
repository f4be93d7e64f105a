import { act, screen, waitFor, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { ForecastUpdate } from '@stillwell/shared/forecasts';
import { latestForecastQueryKey } from '../../features/forecasts/api/get-latest-forecast';
import { FakeUPlot } from '../../testing/fake-uplot';
import { definition, makeSeries, makeStatus, SITE_NOW } from '../../testing/fixtures';
import { makeRun, makeUpdate } from '../../testing/forecast-fixtures';
import { renderApp } from '../../testing/render-app';
import { stubFetch } from '../../testing/stub-fetch';

vi.mock('uplot', async () => ({ default: (await import('../../testing/fake-uplot')).FakeUPlot }));

const base = `/api/reservoirs/${definition.id}`;
const OVERVIEW = `/reservoirs/${definition.id}/overview`;
const WALL0 = Date.UTC(2030, 0, 1);

function stubGateway(latest: unknown = makeUpdate()) {
  return stubFetch({
    [base]: { version: 3, definition },
    [`${base}/status`]: makeStatus(),
    [`${base}/channels/pool.radar/readings`]: makeSeries('pool.radar', [
      [SITE_NOW - 60_000, 206.95],
    ]),
    [`${base}/channels/inflow/readings`]: makeSeries('inflow', [[SITE_NOW - 60_000, 840]]),
    [`${base}/forecasts/latest`]: latest,
  });
}

const chart = () => FakeUPlot.instances.filter((p) => !p.destroyed).at(-1)!;

describe('overview with the forecast', () => {
  beforeEach(() => {
    FakeUPlot.instances.length = 0;
    // only Date is faked: the wall clock the countdown ticks on is the test's to move
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(WALL0);
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('shows the countdown, the peak and the next threshold, with the caution', async () => {
    stubGateway();
    renderApp(OVERVIEW);
    const countdown = await screen.findByTestId('time-left');
    await waitFor(() =>
      expect(within(countdown).getByTestId('time-left-clock').textContent).toBe('2:30:00'),
    );
    expect(countdown.getAttribute('data-state')).toBe('ok');
    expect(screen.getByTestId('forecast-peak').textContent).toBe('209.40');
    // the aux spillway crest 20 h ahead (the lower levels are already exceeded)
    expect(screen.getByTestId('next-threshold').textContent).toBe('20 h 00 min');
    expect(screen.getByTestId('hold-now').textContent).toBe('3.60');
    expect(screen.getByTestId('forecast-caution').textContent).toMatch(
      /Decision support only.*emergency action plan, local codes and the responsible licensed engineer prevail/,
    );
  });

  it('lists the time to each threshold, lowest first, with those already passed marked', async () => {
    stubGateway();
    renderApp(OVERVIEW);
    const outlook = await screen.findByTestId('threshold-outlook');
    const items = within(outlook)
      .getAllByTestId(/^threshold-outlook-/)
      .map((el) => [el.dataset.testid, el.dataset.tone, el.textContent]);
    expect(items.map(([id, tone]) => [id, tone])).toEqual([
      ['threshold-outlook-watch', 'above'],
      ['threshold-outlook-normal-max', 'above'],
      ['threshold-outlook-aux-spillway', 'ahead'],
      ['threshold-outlook-freeboard-limit', 'clear'],
    ]);
    expect(items[2]![2]).toMatch(/in 20 h 00 min · 10:00 GMT.*80 % of the ensemble/);
    expect(items[3]![2]).toMatch(/not reached/);
  });

  it('draws the band and the median ahead of now, with the x axis reaching past now', async () => {
    stubGateway();
    renderApp(OVERVIEW);
    await waitFor(() =>
      expect(
        Array.from(chart().data[4] as ArrayLike<number | null | undefined>).filter((v) => v != null)
          .length,
      ).toBeGreaterThan(100),
    );
    const [xs, pool, , low, median, high] = chart().data;
    const now = SITE_NOW / 1000;
    expect(xs.at(-1)).toBe(now + 12 * 3600);
    // observed points have no forecast values and forecast points no observed ones
    const observedAt = xs.indexOf(now - 60);
    expect(pool![observedAt]).toBe(206.95);
    expect(median![observedAt]).toBeUndefined();
    const end = xs.length - 1;
    expect(pool![end]).toBeUndefined();
    expect(low![end]!).toBeLessThan(median![end]!);
    expect(high![end]!).toBeGreaterThan(median![end]!);
    expect(chart().opts.bands).toEqual([{ series: [5, 3], fill: expect.any(String) }]);
    const range = chart().opts.scales!.x!.range as (...a: unknown[]) => [number, number];
    expect(range(null, 0, 0, 'x')).toEqual([now - 6 * 3600, now + 12 * 3600]);
  });

  it('ticks in site time between pushes, and turns to past when the latest start goes by', async () => {
    stubGateway();
    renderApp(OVERVIEW);
    const clock = await screen.findByTestId('time-left-clock');
    await waitFor(() => expect(clock.textContent).toBe('2:30:00'));
    // 10 wall seconds at 360x are an hour of site time
    act(() => {
      vi.setSystemTime(WALL0 + 10_000);
    });
    await waitFor(() => expect(clock.textContent).toBe('1:30:00'));
    expect(screen.getByTestId('time-left').getAttribute('data-state')).toBe('soon');
    act(() => {
      vi.setSystemTime(WALL0 + 26_000);
    });
    await waitFor(() =>
      expect(screen.getByTestId('time-left').getAttribute('data-state')).toBe('past'),
    );
    expect(screen.getByTestId('time-left-headline').textContent).toBe(
      'Too late for the standard plan',
    );
  });

  it('takes pushed runs and follows the forecast room', async () => {
    stubGateway();
    const { socket, queryClient } = renderApp(OVERVIEW);
    await screen.findByTestId('time-left-clock');
    act(() => socket.serverConnects());
    expect(socket.forecastSubscriptions.map((s) => s.request)).toEqual([
      { reservoirId: definition.id },
    ]);
    const run = makeRun({ id: 8, computedAtMs: SITE_NOW + 60_000 });
    const impossible = {
      ...run,
      timeLeft: {
        ...run.timeLeft,
        status: 'impossible' as const,
        latestStartMs: null,
        message: 'even started now the peak is 211 m',
      },
    };
    act(() => socket.push('forecast', makeUpdate(impossible)));
    await waitFor(() =>
      expect(screen.getByTestId('time-left').getAttribute('data-state')).toBe('impossible'),
    );
    // an older run pushed late does not win (the cache is written at once: no waiting)
    act(() => socket.push('forecast', makeUpdate(makeRun())));
    const cached = queryClient.getQueryData<ForecastUpdate>(latestForecastQueryKey(definition.id));
    expect(cached?.run?.id).toBe(8);
    expect(screen.getByTestId('time-left').getAttribute('data-state')).toBe('impossible');
  });

  it('says plainly when there is no forecast yet, and why', async () => {
    stubGateway(
      makeUpdate(null, 'no usable pool reading: every pool gauge is stale, suspect or bad'),
    );
    renderApp(OVERVIEW);
    const countdown = await screen.findByTestId('time-left');
    await waitFor(() => expect(countdown.getAttribute('data-state')).toBe('none'));
    expect(countdown.textContent).toContain('every pool gauge is stale');
    expect(screen.getByTestId('forecast-peak').textContent).toBe('—');
  });
});
