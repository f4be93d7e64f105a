import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { permissionsOf, type Me, type Role } from '@stillwell/shared/access';
import type { DamSafety } from '@stillwell/shared/alarms';
import type { LimitsChange } from '@stillwell/shared/reservoirs';
import { signIn, signOut } from '../../../lib/auth-session';
import { makeAlarmList } from '../../../testing/alarm-fixtures';
import { definition, makeStatus, SITE_NOW } from '../../../testing/fixtures';
import { stubApi } from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

vi.mock('uplot', async () => ({
  default: (await import('../../../testing/fake-uplot')).FakeUPlot,
}));

const base = `/api/reservoirs/${definition.id}`;
const LIMITS = `POST ${base}/definition/limits`;
const NOTE = 'weir survey: the left notch was recut';

const EMPTY: DamSafety = {
  reservoirId: definition.id,
  definitionVersion: 4,
  fromMs: SITE_NOW - 3_600_000,
  toMs: SITE_NOW,
  pool: { channel: 'pool.radar', t: [], v: [] },
  weirs: [],
  piezometers: [],
  massBalance: null,
};

function me(role: Role): Me {
  return {
    id: `u-${role}`,
    username: role,
    displayName: role,
    roles: [role],
    permissions: permissionsOf([role]),
    sessionId: 's1',
    stepUpUntil: null,
    totpEnabled: false,
    mustChangePassword: false,
  };
}

function gateway(routes: Record<string, unknown> = {}) {
  return stubApi({
    [`GET ${base}`]: { version: 4, definition },
    [`GET ${base}/status`]: makeStatus(),
    [`GET ${base}/alarms`]: makeAlarmList([]),
    [`GET ${base}/dam-safety`]: EMPTY,
    ...routes,
  });
}

async function signedInAs(role: Role) {
  expect(await signIn(role, 'any-password')).toBeNull();
}

const token = (role: Role) => ({
  accessToken: `token-${role}`,
  expiresAt: new Date(Date.now() + 900_000).toISOString(),
  me: me(role),
});

async function openForm() {
  const view = renderApp(`/reservoirs/${definition.id}/dam-safety`);
  await screen.findByTestId('limits-form');
  return view;
}

/** A whole value at once: typing key by key into a form of some fifty fields is slow in jsdom. */
function replace(testId: string, text: string) {
  fireEvent.change(screen.getByTestId(testId), { target: { value: text } });
}

const helperOf = (testId: string) =>
  screen
    .getByTestId(testId)
    .closest('.MuiFormControl-root')!
    .querySelector('.MuiFormHelperText-root')?.textContent;

afterEach(async () => {
  await signOut();
});

// a ceiling for a shared, busy CPU (the page renders some fifty fields), not a speed check
describe('the limits form', { timeout: 20_000 }, () => {
  it('will not send a limit that is not a number or a change without a note', async () => {
    const calls = gateway();
    await openForm();
    replace('limit-weir.weir-left.maxFlow', '');
    replace('limits-note', 'no');
    fireEvent.click(screen.getByTestId('limits-save'));
    expect(helperOf('limit-weir.weir-left.maxFlow')).toBe('enter a number');

    replace('limit-weir.weir-left.maxFlow', '-2');
    fireEvent.click(screen.getByTestId('limits-save'));
    await waitFor(() => expect(helperOf('limits-note')).toMatch(/say why the limits change/));
    expect(helperOf('limit-weir.weir-left.maxFlow')).toMatch(/>0/);
    expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
  });

  it('sends the change on the version it was opened on and says when another came first', async () => {
    let gets = 0;
    const calls = gateway({
      // another engineer's change lands while this form is open
      [`GET ${base}`]: () => ({ version: ++gets === 1 ? 4 : 5, definition }),
      [LIMITS]: Response.json(
        { statusCode: 409, message: 'the definition is at version 5, not 4', code: 'stale' },
        { status: 409 },
      ),
    });
    const { queryClient } = await openForm();
    replace('limit-weir.weir-left.maxFlow', '17');
    await queryClient.refetchQueries({ queryKey: ['reservoirs', definition.id] });
    expect(gets).toBe(2);
    replace('limits-note', NOTE);
    fireEvent.click(screen.getByTestId('limits-save'));
    const conflict = await screen.findByTestId('limits-conflict');
    expect(conflict.textContent).toMatch(
      /definition changed since you opened it \(version 4\); reload/,
    );
    const sent = calls.find((c) => `${c.method} ${c.path}` === LIMITS)!.body as LimitsChange;
    expect(sent.baseVersion).toBe(4);
    expect(sent.note).toBe(NOTE);
    expect(sent.seepageWeirs?.[0]?.maxFlow).toBe(0.017);
    // the edit stays on screen until the person reloads
    expect(screen.getByTestId('limit-weir.weir-left.maxFlow')).toHaveProperty('value', '17');
    fireEvent.click(within(conflict).getByRole('button', { name: 'Reload' }));
    await waitFor(() =>
      expect(screen.getByTestId('limits-form').getAttribute('data-version')).toBe('5'),
    );
    expect(screen.getByTestId('limit-weir.weir-left.maxFlow')).toHaveProperty('value', '15');
  });

  it('shows the gateway’s field message beside the field', async () => {
    gateway({
      [LIMITS]: Response.json(
        {
          statusCode: 400,
          error: 'Bad Request',
          message: ['piezometers[1].maxLevel: above the dam crest'],
          problems: [{ field: 'piezometers[1].maxLevel', message: 'above the dam crest' }],
        },
        { status: 400 },
      ),
    });
    await openForm();
    replace('limit-piezometer.p2.maxLevel', '211');
    replace('limits-note', NOTE);
    fireEvent.click(screen.getByTestId('limits-save'));
    await waitFor(() =>
      expect(helperOf('limit-piezometer.p2.maxLevel')).toBe('above the dam crest'),
    );
  });

  it('asks the engineer to confirm who they are, then opens again on the new version', async () => {
    let saved = false;
    const rise = definition.alarms!.rateOfRise!;
    const after = {
      ...definition,
      alarms: { ...definition.alarms, rateOfRise: { ...rise, limit: 0.25 } },
    };
    const calls = gateway({
      'POST /api/auth/sign-in': token('engineer'),
      'POST /api/auth/sign-out': new Response(null, { status: 204 }),
      'POST /api/auth/step-up': { stepUpUntil: new Date(Date.now() + 300_000).toISOString() },
      [`GET ${base}`]: () =>
        saved ? { version: 5, definition: after } : { version: 4, definition },
      [LIMITS]: () => {
        saved = true;
        return {
          reservoirId: definition.id,
          version: 5,
          previousVersion: 4,
          change: 'limits',
          changes: [{ field: 'alarms.rateOfRise.limit', from: 0.3, to: 0.25 }],
        };
      },
    });
    await signedInAs('engineer');
    await openForm();
    replace('limit-rateOfRise.limit', '0.25');
    replace('limits-note', NOTE);
    fireEvent.click(screen.getByTestId('limits-save'));
    const dialog = await screen.findByRole('dialog');
    expect(calls.some((c) => c.path === `${base}/definition/limits`)).toBe(false);
    fireEvent.change(within(dialog).getByTestId('step-up-password'), {
      target: { value: 'any-password' },
    });
    fireEvent.click(within(dialog).getByTestId('step-up-confirm'));
    const message = await screen.findByTestId('limits-saved');
    expect(message.textContent).toMatch(/version 5: Pool, rate-of-rise limit: 0\.3 → 0\.25 m\/h/);
    const order = calls.filter((c) => c.method === 'POST').map((c) => c.path);
    expect(order).toEqual(['/api/auth/sign-in', '/api/auth/step-up', `${base}/definition/limits`]);
    await waitFor(() =>
      expect(screen.getByTestId('limits-form').getAttribute('data-version')).toBe('5'),
    );
    expect(screen.getByTestId('limit-rateOfRise.limit')).toHaveProperty('value', '0.25');
    expect(screen.getByTestId('limits-note')).toHaveProperty('value', '');
  });

  it('shows the limits read-only to an operator', async () => {
    gateway({
      'POST /api/auth/sign-in': token('operator'),
      'POST /api/auth/sign-out': new Response(null, { status: 204 }),
    });
    await signedInAs('operator');
    await openForm();
    expect(screen.getByTestId('limits-form').textContent).toMatch(
      /Only the duty engineer can change these limits/,
    );
    expect(screen.getByTestId('limit-weir.weir-left.maxFlow')).toHaveProperty('readOnly', true);
    expect(screen.queryByTestId('limits-save')).toBeNull();
    expect(screen.queryByTestId('limits-note')).toBeNull();
  });
});
