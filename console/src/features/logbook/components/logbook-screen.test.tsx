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

  it('opens a printable sheet with the head as it is now, grouped for reading aloud', async () => {
    const calls = gateway();
    renderApp(`/reservoirs/${definition.id}/logbook`);
    await screen.findByTestId('logbook-head-hash');
    await userEvent.click(screen.getByTestId('logbook-head-sheet-link'));
    const sheet = await screen.findByTestId('logbook-head-sheet');
    const hash = within(sheet).getByTestId('logbook-head-sheet-hash');
    expect(hash.getAttribute('data-hash')).toBe(entry(2).hash);
    expect(hash.textContent).toBe(entry(2).hash.match(/.{8}/g)!.join(' '));
    expect(within(sheet).getByTestId('logbook-head-seq').textContent).toBe('2');
    expect(sheet.textContent).toMatch(
      new RegExp(`/api/logbook/verify\\?headSeq=2&headHash=${entry(2).hash}`),
    );
    // the sheet asks the gateway again rather than printing what the screen had cached
    expect(calls.filter((c) => c.path === '/api/logbook/head').length).toBeGreaterThanOrEqual(2);
    // no console frame around it: nothing but the sheet is printed
    expect(screen.queryByTestId('logbook-grid')).toBeNull();
  });

  it('records a handover from the shift-log form: to whom, what, and the files attached', async () => {
    const calls = stubApi({
      'GET /api/reservoirs': [],
      [`GET ${base}`]: { version: 3, definition },
      [`GET ${base}/status`]: makeStatus(),
      'GET /api/logbook': { rows: [], total: 0 },
      'GET /api/logbook/head': { seq: null, hash: null, time: null },
      'GET /api/logbook/verification': null,
      'POST /api/logbook/handovers': entry(1, 'shift.handover', {
        from: 'operator',
        to: 'Jory Penhale',
        text: 'gate 2 at 3.0 m',
      }),
    });
    renderApp(`/reservoirs/${definition.id}/logbook`);
    const form = await screen.findByTestId('shift-log-form');
    await userEvent.click(within(form).getByRole('button', { name: 'Handover' }));
    const submit = within(form).getByTestId('shift-log-submit');
    await userEvent.type(within(form).getByTestId('shift-log-text'), 'gate 2 at 3.0 m');
    // a handover names who takes over: without it nothing can be recorded
    expect(submit).toHaveProperty('disabled', true);
    await userEvent.type(within(form).getByLabelText('Handing over to'), 'Jory Penhale');
    const pdf = new File(['%PDF-1.4\n%%EOF\n'], 'seal-inspection.pdf', {
      type: 'application/pdf',
    });
    const input = form.querySelector('input[type="file"]') as HTMLInputElement;
    await userEvent.upload(input, pdf);
    expect(submit).toHaveProperty('disabled', false);
    await userEvent.click(submit);
    await waitFor(() =>
      expect(calls.some((c) => c.method === 'POST' && c.path === '/api/logbook/handovers')).toBe(
        true,
      ),
    );
    const body = calls.find((c) => c.path === '/api/logbook/handovers')!.body as FormData;
    expect(body.get('to')).toBe('Jory Penhale');
    expect(body.get('text')).toBe('gate 2 at 3.0 m');
    expect((body.getAll('attachments') as File[]).map((f) => f.name)).toEqual([
      'seal-inspection.pdf',
    ]);
    // the form is ready for the next entry
    await waitFor(() =>
      expect((within(form).getByTestId('shift-log-text') as HTMLTextAreaElement).value).toBe(''),
    );
  });
});
