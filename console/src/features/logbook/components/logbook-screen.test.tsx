import { act, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import type { LogbookEntry } from '@stillwell/shared/logbook';
import { definition, makeStatus } from '../../../testing/fixtures';
import { stubApi, type Call } from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

const base = `/api/reservoirs/${definition.id}`;
const entry = (
  seq: number,
  kind = 'order.drafted',
  payload: Record<string, unknown> = { orderId: 3, controls: ['gate-2'] },
): LogbookEntry => ({
  seq,
  time: new Date(Date.UTC(2026, 2, 3, 14, seq)).toISOString(),
  actorId: 'u1',
  actorName: 'operator',
  actorRoles: ['operator'],
  kind,
  payload,
  prevHash: '0'.repeat(64),
  hash: String(seq).padStart(64, 'f'),
});

function gateway() {
  return stubApi({
    'GET /api/reservoirs': [],
    [`GET ${base}`]: { version: 3, definition },
    [`GET ${base}/status`]: makeStatus(),
    'GET /api/logbook': (c: Call) =>
      c.path
        ? { rows: [entry(2), entry(1, 'shift.note', { text: 'gate 2 seal weeping' })], total: 2 }
        : null,
    'GET /api/logbook/head': { seq: 2, hash: entry(2).hash, time: entry(2).time },
    'GET /api/logbook/verification': null,
    'GET /api/logbook/verify': {
      ok: true,
      count: 2,
      headSeq: 2,
      headHash: entry(2).hash,
      checkedAt: new Date().toISOString(),
      attachments: { checked: 0, bad: [] },
    },
  });
}

describe('the logbook screen', () => {
  it('pages on the server, shows the head hash, verifies on request, and takes new entries live', async () => {
    const calls = gateway();
    const { socket } = renderApp(`/reservoirs/${definition.id}/logbook`);
    const grid = await screen.findByTestId('logbook-grid');
    await within(grid).findByText('gate 2 seal weeping');
    const first = calls.find((c) => c.path === '/api/logbook');
    expect(first).toBeDefined();
    expect(screen.getByTestId('logbook-head-hash').textContent).toBe(entry(2).hash);

    await userEvent.click(screen.getByTestId('logbook-verify'));
    await waitFor(() =>
      expect(screen.getByTestId('logbook-chain-state').getAttribute('data-ok')).toBe('true'),
    );
    expect(screen.getByTestId('logbook-chain-state').textContent).toMatch(
      /Chain verified: 2 entries and 0 attachments intact/,
    );

    act(() => socket.serverConnects());
    act(() => socket.logbookFollows.at(-1)!({ ok: true }));
    act(() =>
      socket.push(
        'logbook-entry',
        entry(3, 'shift.handover', { from: 'operator', to: 'Jory', text: 'pool rising 4 cm/h' }),
      ),
    );
    await within(grid).findByText('operator to Jory: pool rising 4 cm/h');
    await waitFor(() =>
      expect(screen.getByTestId('logbook-head-hash').textContent).toBe(entry(3).hash),
    );
  });

  it('shows a broken chain with the entry at fault', async () => {
    stubApi({
      'GET /api/reservoirs': [],
      [`GET ${base}`]: { version: 3, definition },
      [`GET ${base}/status`]: makeStatus(),
      'GET /api/logbook': { rows: [], total: 0 },
      'GET /api/logbook/head': { seq: 2, hash: entry(2).hash, time: entry(2).time },
      'GET /api/logbook/verification': {
        ok: false,
        count: 0,
        headSeq: null,
        headHash: null,
        checkedAt: new Date().toISOString(),
        attachments: {
          checked: 1,
          bad: [
            {
              seq: 1,
              sha256: 'a'.repeat(64),
              problem: 'altered',
              detail:
                'entry 1: attachment aaaa no longer hashes to its recorded SHA-256 (its bytes were changed)',
            },
          ],
        },
      },
    });
    renderApp(`/reservoirs/${definition.id}/logbook`);
    await waitFor(() =>
      expect(screen.getByTestId('logbook-chain-state').getAttribute('data-ok')).toBe('false'),
    );
    expect(screen.getByTestId('logbook-chain-state').textContent).toMatch(
      /Chain broken: entry 1: attachment .* bytes were changed/,
    );
  });
});
