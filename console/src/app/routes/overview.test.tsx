import { act, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { UNIT_SYSTEM_STORAGE_KEY } from '../../hooks/use-unit-system';
import { FakeUPlot } from '../../testing/fake-uplot';
import { definition, makeReading, makeSeries, makeStatus, SITE_NOW } from '../../testing/fixtures';
import { renderApp } from '../../testing/render-app';
import { stubFetch } from '../../testing/stub-fetch';

vi.mock('uplot', async () => ({ default: (await import('../../testing/fake-uplot')).FakeUPlot }));

const base = `/api/reservoirs/${definition.id}`;
const OVERVIEW = `/reservoirs/${definition.id}/overview`;

function stubGateway() {
  return stubFetch({
    '/api/reservoirs': [
      {
        id: definition.id,
        name: definition.name,
        damName: definition.damName,
        timeZone: definition.timeZone,
        version: 3,
      },
    ],
    [base]: { version: 3, definition },
    [`${base}/status`]: makeStatus(),
    [`${base}/channels/pool.radar/readings`]: makeSeries('pool.radar', [
      [SITE_NOW - 120_000, 206.9],
      [SITE_NOW - 60_000, 206.95],
    ]),
    [`${base}/channels/inflow/readings`]: makeSeries('inflow', [[SITE_NOW - 60_000, 840]]),
  });
}

/** The chart as last drawn: the newest x (s) and pool value. */
function lastDrawnPoint() {
  const chart = FakeUPlot.instances.filter((p) => !p.destroyed).at(-1);
  const [xs, pool] = chart?.data ?? [[], []];
  return { x: xs.at(-1), pool: pool?.at(-1) };
}

describe('overview', () => {
  beforeEach(() => {
    FakeUPlot.instances.length = 0;
  });

  it('shows the pool, freeboard, flows and rate of rise in SI', async () => {
    stubGateway();
    renderApp(OVERVIEW);
    expect(await screen.findByTestId('pool-elevation')).toHaveProperty('textContent', '207.00');
    expect(screen.getByTestId('freeboard').textContent).toBe('5.00');
    expect(screen.getByTestId('inflow').textContent).toBe('850.0');
    expect(screen.getByTestId('outflow').textContent).toBe('420.0');
    expect(screen.getByTestId('rate-of-rise').textContent).toBe('+0.125');
    expect(screen.getByRole('region', { name: 'Pool elevation' }).textContent).toContain('m');
  });

  it('converts every number after switching to US customary, and remembers the choice', async () => {
    stubGateway();
    renderApp(OVERVIEW);
    await screen.findByTestId('pool-elevation');
    await userEvent.click(screen.getByRole('button', { name: 'US customary units' }));
    expect(screen.getByTestId('pool-elevation').textContent).toBe('679.13');
    expect(screen.getByTestId('freeboard').textContent).toBe('16.40');
    expect(screen.getByTestId('inflow').textContent).toBe('30,017');
    expect(screen.getByTestId('rate-of-rise').textContent).toBe('+0.41');
    expect(
      within(screen.getByRole('region', { name: 'Pool elevation' })).getByText('ft'),
    ).toBeTruthy();
    expect(localStorage.getItem(UNIT_SYSTEM_STORAGE_KEY)).toBe('us');
  });

  it('opens in the units remembered from last time', async () => {
    localStorage.setItem(UNIT_SYSTEM_STORAGE_KEY, 'us');
    stubGateway();
    renderApp(OVERVIEW);
    expect((await screen.findByTestId('pool-elevation')).textContent).toBe('679.13');
  });

  it('marks a stale channel stale and a bad reading bad, and leaves good ones unmarked', async () => {
    stubGateway();
    renderApp(OVERVIEW);
    const rain = await screen.findByTestId('channel-row-rain');
    expect(rain.getAttribute('data-stale')).toBe('true');
    expect(within(rain).getByText('STALE')).toBeTruthy();
    const radar = screen.getByTestId('channel-row-pool.radar');
    expect(radar.getAttribute('data-stale')).toBe('false');
    expect(within(radar).queryByText(/STALE|SUSPECT|BAD/)).toBeNull();
    const tailwater = screen.getByTestId('channel-row-tailwater');
    expect(within(tailwater).getByText('BAD')).toBeTruthy();
    // A gauge that never reported is not shown as current either.
    expect(screen.getByTestId('channel-row-gate.1.opening').getAttribute('data-stale')).toBe(
      'true',
    );
  });

  it('shows the site time in the site zone, named, with the simulated clock badge', async () => {
    stubGateway();
    renderApp(OVERVIEW);
    // 14:00:00 UTC on 3 March is 14:00:00 GMT in London.
    expect((await screen.findByTestId('site-clock')).textContent).toBe('14:00:00 GMT');
    expect(screen.getByTestId('simulated-clock').textContent).toBe('SIMULATED ×360');
    expect(screen.getByText(/Europe\/London/)).toBeTruthy();
  });

  it('follows the live connection state', async () => {
    stubGateway();
    const { socket } = renderApp(OVERVIEW);
    const badge = await screen.findByTestId('connection-state');
    expect(badge.getAttribute('data-state')).toBe('connecting');
    act(() => socket.serverConnects());
    expect(badge.textContent).toBe('Connected');
    act(() => socket.serverDrops());
    expect(badge.textContent).toBe('Reconnecting');
    socket.active = false;
    act(() => socket.serverDrops('io server disconnect'));
    expect(badge.textContent).toBe('Offline');
  });

  it('draws the fetched range, then the readings pushed live', async () => {
    stubGateway();
    const { socket } = renderApp(OVERVIEW);
    await waitFor(() => expect(lastDrawnPoint().x).toBe((SITE_NOW - 60_000) / 1000));
    expect(lastDrawnPoint().pool).toBe(206.95);

    act(() => socket.push('readings', [makeReading('pool.radar', SITE_NOW, 207)]));
    await waitFor(() => expect(lastDrawnPoint()).toEqual({ x: SITE_NOW / 1000, pool: 207 }));
    // One chart, fed with setData, not rebuilt for new data.
    expect(FakeUPlot.instances.filter((p) => !p.destroyed)).toHaveLength(1);
  });

  it('resubscribes after a reconnect and refetches what it missed', async () => {
    const { calls } = stubGateway();
    const { socket } = renderApp(OVERVIEW);
    await waitFor(() => expect(lastDrawnPoint().pool).toBe(206.95));
    const readingFetches = () =>
      calls.filter((url) => url.pathname === `${base}/channels/pool.radar/readings`).length;
    const before = readingFetches();
    act(() => socket.serverConnects());
    act(() => socket.serverDrops());
    act(() => socket.serverConnects());
    expect(socket.subscriptions).toHaveLength(2);
    act(() => socket.subscriptions[1]?.ack({ ok: true }));
    await waitFor(() => expect(readingFetches()).toBe(before + 1));
    const last = calls.filter((url) => url.pathname.endsWith('pool.radar/readings')).at(-1);
    // The window is the site's: it ends at the site clock, not at this computer's.
    expect(last?.searchParams.get('to')).toBe(new Date(SITE_NOW).toISOString());
    expect(last?.searchParams.get('from')).toBe(new Date(SITE_NOW - 6 * 3_600_000).toISOString());
  });

  it('pushes a new pool elevation to the readout as statuses arrive', async () => {
    stubGateway();
    const { socket } = renderApp(OVERVIEW);
    await screen.findByTestId('pool-elevation');
    const next = makeStatus({
      clock: { now: SITE_NOW + 60_000, speed: 360, simulated: true },
      pool: { elevation: 207.42, source: 'pool.radar', freeboard: 4.58, rateOfRise: 0.2 },
    });
    act(() => socket.push('status', next));
    // The query cache tells its observers on its own schedule, hence waitFor.
    await waitFor(() => expect(screen.getByTestId('pool-elevation').textContent).toBe('207.42'));
    expect(screen.getByTestId('site-clock').textContent).toBe('14:01:00 GMT');
  });

  it('says so when the status cannot be loaded', async () => {
    stubFetch({
      [base]: { version: 3, definition },
      [`${base}/status`]: Response.json(
        { statusCode: 503, message: 'No site clock yet', error: 'Service Unavailable' },
        { status: 503 },
      ),
    });
    renderApp(OVERVIEW);
    expect(await screen.findByText(/No site clock yet/)).toBeTruthy();
    expect(screen.queryByTestId('pool-elevation')).toBeNull();
  });
});
