import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { makeAlarm, makeAlarmList } from '../../../testing/alarm-fixtures';
import { definition, makeStatus, SITE_NOW } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';
import { stubFetch } from '../../../testing/stub-fetch';

vi.mock('uplot', async () => ({
  default: (await import('../../../testing/fake-uplot')).FakeUPlot,
}));

const base = `/api/reservoirs/${definition.id}`;

// in the gateway's order: unacknowledged first, then priority, then the newest
const LIST = makeAlarmList([
  makeAlarm('gate-not-following.gate-2', {
    kind: 'gate-not-following',
    priority: 'immediate',
    label: 'Gate 2 not following its command',
    source: 'external',
    message: 'gate 2 at 1.2 m, commanded 4.5 m',
    value: null,
    limit: null,
    unit: null,
  }),
  makeAlarm('pool-high.watch', { label: 'Pool above Watch level (205.50 m)' }),
  makeAlarm('rate-of-rise', {
    priority: 'prompt',
    state: 'acknowledged',
    acknowledged: true,
    label: 'Pool rising fast',
    acknowledgedBy: 'operator',
  }),
  makeAlarm('frozen.inflow', {
    handling: 'shelved',
    state: 'shelved',
    reason: 'gauge being cleaned',
    handledBy: 'engineer',
    shelvedUntilMs: SITE_NOW + 3_600_000,
  }),
]);

function stubGateway(extra: Record<string, unknown> = {}) {
  return stubFetch({
    [base]: { version: 3, definition },
    [`${base}/status`]: makeStatus(),
    [`${base}/alarms`]: LIST,
    ...extra,
  });
}

describe('alarm banner', () => {
  it('shows the counts by priority on every screen, the unacknowledged called out', async () => {
    stubGateway();
    renderApp(`/reservoirs/${definition.id}/overview`);
    const immediate = await screen.findByTestId('alarm-count-immediate');
    await waitFor(() => expect(immediate.textContent).toBe('Immediate 1 (1 new)'));
    expect(screen.getByTestId('alarm-count-prompt').textContent).toBe('Prompt 1');
    expect(screen.getByTestId('alarm-count-advisory').textContent).toBe('Advisory 1 (1 new)');
    expect(screen.getByTestId('alarm-count-away').textContent).toMatch(
      /1 shelved, 0 out of service/,
    );
  });

  it('is not shown to a role that does not see alarms', async () => {
    stubGateway({
      [`${base}/alarms`]: () =>
        Response.json(
          { statusCode: 403, message: 'forbidden', code: 'forbidden' },
          { status: 403 },
        ),
    });
    renderApp(`/reservoirs/${definition.id}/overview`);
    await screen.findByTestId('pool-elevation');
    await waitFor(() => expect(screen.queryByTestId('alarm-banner')).toBeNull());
  });
});

describe('alarm list', () => {
  it('lists in the gateway’s order with ISA-18.2 state names', async () => {
    stubGateway();
    renderApp(`/reservoirs/${definition.id}/alarms`);
    const table = await screen.findByRole('table', { name: 'Alarms' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((r) => r.getAttribute('data-testid'))).toEqual([
      'alarm-row-gate-not-following.gate-2',
      'alarm-row-pool-high.watch',
      'alarm-row-rate-of-rise',
      'alarm-row-frozen.inflow',
    ]);
    expect(within(rows[0]!).getByTestId('alarm-state').textContent).toBe('Active, unacknowledged');
    expect(within(rows[2]!).getByTestId('alarm-state').textContent).toBe('Active, acknowledged');
    expect(rows[3]!.textContent).toMatch(/Shelved by engineer: gauge being cleaned/);
    // already acknowledged: no acknowledge button; shelved: returned, not shelved again
    expect(within(rows[2]!).queryByRole('button', { name: 'Acknowledge' })).toBeNull();
    expect(within(rows[3]!).getByRole('button', { name: 'Return to service' })).toBeTruthy();
  });

  it('acknowledges with a comment, sending it to the gateway', async () => {
    const posted: unknown[] = [];
    stubGateway({
      [`${base}/alarms/pool-high.watch/acknowledge`]: () => {
        posted.push('called');
        return makeAlarm('pool-high.watch', { state: 'acknowledged', acknowledged: true });
      },
    });
    const fetchSpy = vi.mocked(globalThis.fetch);
    renderApp(`/reservoirs/${definition.id}/alarms`);
    const row = await screen.findByTestId('alarm-row-pool-high.watch');
    await userEvent.click(within(row).getByRole('button', { name: 'Acknowledge' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.type(within(dialog).getByTestId('alarm-action-text'), 'watching the inflow');
    await userEvent.click(within(dialog).getByTestId('alarm-action-confirm'));
    await waitFor(() => expect(posted).toEqual(['called']));
    const call = fetchSpy.mock.calls.find(([url]) => String(url).endsWith('/acknowledge'))!;
    expect(JSON.parse(String(call[1]!.body))).toEqual({ comment: 'watching the inflow' });
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
  });

  it('will not shelve without a reason, and shows the gateway’s refusal', async () => {
    stubGateway({
      [`${base}/alarms/pool-high.watch/shelve`]: () =>
        Response.json(
          { statusCode: 409, message: 'the alarm is shelved already', code: 'not-in-service' },
          { status: 409 },
        ),
    });
    renderApp(`/reservoirs/${definition.id}/alarms`);
    const row = await screen.findByTestId('alarm-row-pool-high.watch');
    await userEvent.click(within(row).getByRole('button', { name: 'Shelve' }));
    const dialog = await screen.findByRole('dialog');
    const confirm = within(dialog).getByTestId('alarm-action-confirm');
    expect(confirm).toHaveProperty('disabled', true);
    await userEvent.type(within(dialog).getByTestId('alarm-action-text'), 'gauge survey');
    expect(confirm).toHaveProperty('disabled', false);
    await userEvent.click(confirm);
    expect((await within(dialog).findByRole('alert')).textContent).toMatch(
      /shelved already \(HTTP 409\)/,
    );
  });

  it('shows an alarm’s history with who did what', async () => {
    stubGateway({
      [`${base}/alarms/pool-high.watch/history`]: {
        condition: {
          id: 'pool-high.watch',
          kind: 'pool-high',
          label: 'Pool above Watch level (205.50 m)',
          priority: 'advisory',
          source: 'telemetry',
          unit: 'm',
          limit: 205.5,
          deadband: 0.05,
          onDelayS: 120,
          offDelayS: 0,
          subject: 'watch',
        },
        alarm: LIST.alarms[1],
        events: [
          {
            id: 2,
            reservoirId: definition.id,
            conditionId: 'pool-high.watch',
            kind: 'acknowledged',
            siteTimeMs: SITE_NOW,
            priority: 'advisory',
            annunciated: false,
            actor: 'operator',
            text: 'seen',
            value: null,
            logbookSeq: 17,
          },
          {
            id: 1,
            reservoirId: definition.id,
            conditionId: 'pool-high.watch',
            kind: 'raised',
            siteTimeMs: SITE_NOW - 60_000,
            priority: 'advisory',
            annunciated: true,
            actor: null,
            text: 'pool 205.62 m',
            value: 205.62,
            logbookSeq: null,
          },
        ],
      },
    });
    renderApp(`/reservoirs/${definition.id}/alarms`);
    const row = await screen.findByTestId('alarm-row-pool-high.watch');
    await userEvent.click(within(row).getByRole('button', { name: 'History' }));
    const events = await screen.findAllByTestId('alarm-history-event');
    expect(events[0]!.textContent).toMatch(
      /Acknowledged by operator — 14:00:00 GMT.*seen · logbook #17/,
    );
    expect(events[1]!.textContent).toMatch(/^Raised — 13:59:00 GMT/);
    expect(screen.getByTestId('alarm-history').textContent).toMatch(
      /on-delay 120 s · deadband 0.05 m/,
    );
  });
});
