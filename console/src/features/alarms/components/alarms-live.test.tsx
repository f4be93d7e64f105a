import { act, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { makeAlarm, makeAlarmList } from '../../../testing/alarm-fixtures';
import { definition, makeStatus } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';
import { stubFetch } from '../../../testing/stub-fetch';

vi.mock('uplot', async () => ({
  default: (await import('../../../testing/fake-uplot')).FakeUPlot,
}));

const base = `/api/reservoirs/${definition.id}`;

const PUSHED = makeAlarmList([
  makeAlarm('seepage-high.weir-left', {
    kind: 'seepage-high',
    priority: 'immediate',
    label: 'Left abutment weir above its limit',
    message: 'seepage 17.2 l/s, limit 15.0 l/s',
  }),
]);

function stubGateway() {
  return stubFetch({
    [base]: { version: 3, definition },
    [`${base}/status`]: makeStatus(),
    [`${base}/alarms`]: makeAlarmList([]),
  });
}

const alarmFetches = (calls: URL[]) => calls.filter((u) => u.pathname === `${base}/alarms`).length;

describe('live alarms', () => {
  it('joins the alarms room on connect and shows a pushed list in the banner without a refetch', async () => {
    const { calls } = stubGateway();
    const { socket } = renderApp(`/reservoirs/${definition.id}/overview`);
    const immediate = await screen.findByTestId('alarm-count-immediate');
    await waitFor(() => expect(immediate.textContent).toBe('Immediate 0'));
    act(() => socket.serverConnects());
    expect(socket.alarmsSubscriptions.map((s) => s.request)).toEqual([
      { reservoirId: definition.id },
    ]);
    act(() => socket.alarmsSubscriptions[0]!.ack({ ok: true }));
    const fetched = alarmFetches(calls);

    act(() => socket.push('alarm-list', PUSHED));
    await waitFor(() =>
      expect(screen.getByTestId('alarm-count-immediate').textContent).toBe('Immediate 1 (1 new)'),
    );
    expect(alarmFetches(calls)).toBe(fetched);
  });

  it('puts a pushed alarm straight into the list', async () => {
    const { calls } = stubGateway();
    const { socket } = renderApp(`/reservoirs/${definition.id}/alarms`);
    await screen.findByTestId('no-alarms');
    act(() => socket.serverConnects());
    const fetched = alarmFetches(calls);
    act(() => socket.push('alarm-list', PUSHED));
    const row = await screen.findByTestId('alarm-row-seepage-high.weir-left');
    expect(within(row).getByTestId('alarm-state').textContent).toBe('Active, unacknowledged');
    expect(alarmFetches(calls)).toBe(fetched);
  });

  it('ignores another reservoir’s list and says so when a push cannot be read', async () => {
    stubGateway();
    const { socket } = renderApp(`/reservoirs/${definition.id}/overview`);
    const immediate = await screen.findByTestId('alarm-count-immediate');
    await waitFor(() => expect(immediate.textContent).toBe('Immediate 0'));
    act(() => socket.serverConnects());
    act(() => socket.push('alarm-list', { ...PUSHED, reservoirId: 'another-lake' }));
    act(() => socket.push('alarm-list', { reservoirId: definition.id, alarms: 'none' }));
    const issue = await screen.findByTestId('alarm-live-issue');
    expect(issue.getAttribute('aria-label')).toMatch(/unreadable alarm list/);
    expect(screen.getByTestId('alarm-count-immediate').textContent).toBe('Immediate 0');
  });

  it('says when the gateway refuses live alarms, and leaves the room on leaving', async () => {
    stubGateway();
    const { socket, router } = renderApp(`/reservoirs/${definition.id}/overview`);
    await screen.findByTestId('alarm-banner');
    act(() => socket.serverConnects());
    act(() => socket.alarmsSubscriptions[0]!.ack({ ok: false, error: 'forbidden' }));
    const issue = await screen.findByTestId('alarm-live-issue');
    expect(issue.getAttribute('aria-label')).toBe('Live alarms were refused: forbidden');
    // leaving the reservoir's screens (for the account page) leaves its alarms room
    await act(() => router.navigate('/profile'));
    await waitFor(() =>
      expect(socket.alarmsUnsubscriptions).toEqual([{ reservoirId: definition.id }]),
    );
    expect(socket.listenerCount('alarm-list')).toBe(0);
  });
});
