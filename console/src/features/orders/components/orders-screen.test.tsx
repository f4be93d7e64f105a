import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import type { Order } from '@stillwell/shared/orders';
import { definition, makeStatus } from '../../../testing/fixtures';
import {
  anEmergency,
  makeMe,
  makeOrder,
  people,
  stubApi,
  type Call,
} from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

const base = `/api/reservoirs/${definition.id}`;
const ORDERS = `/reservoirs/${definition.id}/orders`;

function gateway(over: Record<string, unknown> = {}, orders: Order[] = [makeOrder()]) {
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
    [`GET ${base}/orders`]: (c: Call) => c.path && orders,
    [`GET ${base}/emergency`]: { emergency: null },
    [`GET ${base}/automation`]: { rules: [], events: [] },
    'GET /api/auth/me': makeMe('engineer'),
    'GET /api/orders/12': orders[0],
    'GET /api/orders/12/interlocks': { ok: true, checkedAt: new Date().toISOString(), results: [] },
    ...over,
  });
}

async function openOrder() {
  const rows = await screen.findAllByTestId('order-row');
  await userEvent.click(rows[0]!);
  return screen.findByTestId('order-detail');
}

describe('the orders screen explains the two-person rule; the gateway enforces it', () => {
  it('offers a duty engineer Authorise and Decline, and sends the comment', async () => {
    const calls = gateway({
      'POST /api/orders/12/authorise': makeOrder({
        state: 'authorised',
        decision: {
          outcome: 'authorised',
          by: people.engineer,
          at: new Date().toISOString(),
          comment: 'checked',
        },
      }),
    });
    renderApp(ORDERS);
    const detail = await openOrder();
    const authorise = await within(detail).findByTestId('order-authorise');
    expect((authorise as HTMLButtonElement).disabled).toBe(true);
    await userEvent.type(within(detail).getByTestId('order-comment'), 'checked against run 41');
    await userEvent.click(authorise);
    await waitFor(() =>
      expect(calls.find((c) => c.method === 'POST')).toEqual({
        method: 'POST',
        path: '/api/orders/12/authorise',
        body: { comment: 'checked against run 41' },
      }),
    );
  });

  it('does not offer the author to authorise their own order, and says why', async () => {
    gateway({
      'GET /api/auth/me': makeMe('engineer', {
        id: people.operator.userId,
        roles: ['operator', 'engineer'],
      }),
    });
    renderApp(ORDERS);
    const detail = await openOrder();
    await within(detail).findByTestId('order-actions');
    expect(within(detail).queryByTestId('order-authorise')).toBeNull();
    expect(
      within(detail)
        .getAllByTestId('order-not-offered')
        .map((e) => e.textContent),
    ).toContain('You drafted Order 12: another duty engineer must review it (two-person rule)');
  });

  it('asks for the password again when the gateway wants a step-up, then tries once more', async () => {
    const calls = gateway({
      'POST /api/orders/12/authorise': (_c: Call, n: number) =>
        n === 1
          ? Response.json(
              {
                statusCode: 403,
                code: 'step-up-required',
                message: 'Confirm your password (and code) again to do this',
              },
              { status: 403 },
            )
          : makeOrder({ state: 'authorised' }),
      'POST /api/auth/step-up': { stepUpUntil: new Date(Date.now() + 300_000).toISOString() },
    });
    renderApp(ORDERS);
    const detail = await openOrder();
    await userEvent.type(within(detail).getByTestId('order-comment'), 'agreed with the plan');
    await userEvent.click(within(detail).getByTestId('order-authorise'));
    await userEvent.type(await screen.findByTestId('step-up-password'), 'correct horse');
    await userEvent.click(screen.getByTestId('step-up-confirm'));
    await waitFor(() =>
      expect(calls.filter((c) => c.path === '/api/orders/12/authorise')).toHaveLength(2),
    );
    expect(calls.find((c) => c.path === '/api/auth/step-up')?.body).toEqual({
      password: 'correct horse',
    });
  });

  it('an operator sees no Authorise; without an emergency a proposed order is not sent, with one it is flagged', async () => {
    gateway({ 'GET /api/auth/me': makeMe('operator') });
    const first = renderApp(ORDERS);
    let detail = await openOrder();
    await within(detail).findByTestId('order-actions');
    expect(within(detail).queryByTestId('order-authorise')).toBeNull();
    expect(within(detail).queryByTestId('order-execute')).toBeNull();
    expect(
      within(detail)
        .getAllByTestId('order-not-offered')
        .map((e) => e.textContent)
        .join(' '),
    ).toMatch(/has not been authorised by a duty engineer/);
    first.unmount();

    gateway({
      'GET /api/auth/me': makeMe('operator'),
      [`GET ${base}/emergency`]: { emergency: anEmergency },
    });
    renderApp(ORDERS);
    expect((await screen.findByTestId('emergency-banner')).textContent).toMatch(
      /Emergency level 2 declared by engineer/,
    );
    detail = await openOrder();
    expect((await within(detail).findByTestId('order-execute')).textContent).toMatch(
      'Send to gates under the emergency',
    );
  });

  it('shows the interlocks refusing, each with its reason', async () => {
    const refusal = {
      statusCode: 422,
      code: 'interlock',
      message: 'Gate 2 is moving',
      interlocks: {
        ok: false,
        checkedAt: new Date().toISOString(),
        results: [
          {
            code: 'gate-moving',
            ok: false,
            waived: false,
            message:
              'Gate 2 (Gated ogee spillway) is moving (0.40 m to 0.45 m in its last reports). Wait until it has stopped.',
          },
          { code: 'telemetry-stale', ok: true, waived: false, message: 'fresh' },
        ],
      },
    };
    const authorised = makeOrder({
      state: 'authorised',
      authorisedUntil: new Date(Date.UTC(2026, 2, 3, 15)).toISOString(),
    });
    gateway(
      {
        'GET /api/auth/me': makeMe('operator'),
        'GET /api/orders/12': authorised,
        'POST /api/orders/12/execute': Response.json(refusal, { status: 422 }),
      },
      [authorised],
    );
    renderApp(ORDERS);
    const detail = await openOrder();
    await userEvent.click(await within(detail).findByTestId('order-execute'));
    const error = await within(detail).findByTestId('order-action-error');
    expect(error.textContent).toMatch('Not sent: the interlocks refused.');
    expect(error.textContent).toMatch(/Gate 2 .* is moving .* Wait until it has stopped/);
    expect(error.textContent).not.toMatch('fresh');
  });

  it('lists emergency actions awaiting countersignature', async () => {
    const flagged = makeOrder({
      id: 12,
      state: 'in-position',
      emergency: true,
      awaitingCountersign: true,
    });
    stubApi({
      'GET /api/reservoirs': [],
      [`GET ${base}`]: { version: 3, definition },
      [`GET ${base}/status`]: makeStatus(),
      [`GET ${base}/orders`]: (c: Call) => (c.path ? [flagged] : []),
      [`GET ${base}/emergency`]: { emergency: null },
      [`GET ${base}/automation`]: { rules: [], events: [] },
      'GET /api/auth/me': makeMe('engineer'),
    });
    renderApp(ORDERS);
    const list = await screen.findByTestId('countersign-list');
    expect(within(list).getByTestId('order-row').textContent).toMatch(/12\s*EMERGENCY/);
  });
});
