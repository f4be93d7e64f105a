import { fireEvent, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { definition, makeStatus } from '../../../testing/fixtures';
import { makeMe, makeOrder, stubApi } from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

const base = `/api/reservoirs/${definition.id}`;

describe('drafting a gate operation', () => {
  it('shows the routed effect before submitting, names problems by field, and sends the request', async () => {
    const calls = stubApi({
      'GET /api/reservoirs': [],
      [`GET ${base}`]: { version: 3, definition },
      [`GET ${base}/status`]: makeStatus(),
      [`GET ${base}/orders`]: [],
      [`GET ${base}/emergency`]: { emergency: null },
      [`GET ${base}/automation`]: { rules: [], events: [] },
      'GET /api/auth/me': makeMe('operator'),
      [`POST ${base}/orders`]: makeOrder({ id: 13 }),
      'GET /api/orders/13': makeOrder({ id: 13 }),
      'GET /api/orders/13/interlocks': {
        ok: true,
        checkedAt: new Date().toISOString(),
        results: [],
      },
    });
    renderApp(`/reservoirs/${definition.id}/orders`);
    await userEvent.click(await screen.findByTestId('draft-open'));
    fireEvent.change(screen.getByTestId('draft-target-0-gate-2'), { target: { value: '9.5' } });
    await userEvent.click(screen.getByTestId('draft-submit'));
    const problems = await screen.findByTestId('draft-problems');
    expect(problems.textContent).toMatch(/reason: at least 5 characters/);
    expect(problems.textContent).toMatch(
      /steps\.0\.targets\.0\.target: Gate 2 .*9\.5 m is outside its limits 0\.\.9 m/,
    );
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    fireEvent.change(screen.getByTestId('draft-target-0-gate-2'), { target: { value: '3' } });
    await userEvent.type(screen.getByTestId('draft-reason'), 'draw down ahead of the peak');
    // the pool at 207 m with 850 m3/s coming in: computed here, with the shared hydraulics
    const impact = await screen.findByTestId('order-impact');
    expect(impact.textContent).toMatch(
      /Release \d+ m3\/s now, \d+ m3\/s after the order \(\+\d+ m3\/s\)/,
    );
    expect(screen.getByTestId('order-impact-peak').textContent).toMatch(
      /Forecast peak pool 2\d\d\.\d\d m/,
    );
    await userEvent.click(screen.getByTestId('draft-submit'));
    await waitFor(() =>
      expect(calls.find((c) => c.method === 'POST')?.body).toMatchObject({
        steps: [{ offsetMin: 0, targets: [{ control: 'gate-2', target: 3 }] }],
        reason: 'draw down ahead of the peak',
      }),
    );
    expect((await screen.findByTestId('order-detail')).getAttribute('data-order-id')).toBe('13');
  });
});
