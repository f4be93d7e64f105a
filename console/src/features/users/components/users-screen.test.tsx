import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { permissionsOf, type Me, type User } from '@stillwell/shared/access';
import { signIn, signOut } from '../../../lib/auth-session';
import { stubApi, type Call } from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

const iso = '2026-03-01T08:00:00.000Z';

function admin(stepUpUntil: string | null): Me {
  return {
    id: 'u-admin',
    username: 'admin',
    displayName: 'Sefton Marr',
    roles: ['admin'],
    permissions: permissionsOf(['admin']),
    sessionId: 's1',
    stepUpUntil,
    totpEnabled: false,
    mustChangePassword: false,
  };
}

const user = (over: Partial<User>): User => ({
  id: 'u-op',
  username: 'operator',
  displayName: 'Mara Quill',
  roles: ['operator'],
  disabled: false,
  totpEnabled: false,
  mustChangePassword: false,
  createdAt: iso,
  updatedAt: iso,
  passwordChangedAt: iso,
  ...over,
});

const operator = user({});
const reviewer = user({
  id: 'u-rev',
  username: 'reviewer',
  displayName: 'Odile Brandt',
  roles: ['reviewer'],
  totpEnabled: true,
});

/** An administrator whose step-up still holds (or not), and the gateway's accounts routes. */
async function asAdmin(steppedUp: boolean, routes: Record<string, unknown> = {}) {
  const until = steppedUp ? new Date(Date.now() + 240_000).toISOString() : null;
  const calls = stubApi({
    'POST /api/auth/sign-in': {
      accessToken: 'token-admin',
      expiresAt: new Date(Date.now() + 900_000).toISOString(),
      me: admin(until),
    },
    'GET /api/users': [operator, reviewer],
    ...routes,
  });
  await signIn('admin', 'the-weir-at-arnsey-mill');
  renderApp('/users');
  await screen.findByText('Mara Quill');
  return calls;
}

const sent = (calls: Call[], method: string, path: string) =>
  calls.filter((c) => c.method === method && c.path === path);

afterEach(async () => {
  await signOut();
});

describe("the administrator's users page", () => {
  it('lists every account with its roles and state', async () => {
    await asAdmin(true);
    const grid = screen.getByTestId('users-grid');
    expect(within(grid).getByText('Odile Brandt')).toBeTruthy();
    expect(within(grid).getByText('Reviewer')).toBeTruthy();
    expect(within(grid).getByText('On')).toBeTruthy();
  });

  it('creates an account, checked by the shared schema first, and shows its temporary password once', async () => {
    const calls = await asAdmin(true, {
      'POST /api/users': (c: Call) => ({
        user: user({ id: 'u-new', ...(c.body as object), mustChangePassword: true }),
        temporaryPassword: 'quartz-heron-ladle-sprig',
      }),
    });
    await userEvent.click(screen.getByTestId('new-user'));
    const form = await screen.findByTestId('create-user');
    await userEvent.type(within(form).getByLabelText('Username'), 'Not A Name!');
    await userEvent.click(within(form).getByTestId('create-user-submit'));
    expect(await within(form).findByText('at least one role')).toBeTruthy();
    expect(within(form).getByLabelText('Username').getAttribute('aria-invalid')).toBe('true');
    expect(sent(calls, 'POST', '/api/users')).toHaveLength(0);

    await userEvent.clear(within(form).getByLabelText('Username'));
    await userEvent.type(within(form).getByLabelText('Username'), ' Wren.Ashby ');
    await userEvent.type(within(form).getByLabelText('Full name'), 'Wren Ashby');
    await userEvent.click(within(form).getByLabelText('Operator'));
    await userEvent.click(within(form).getByLabelText('Reviewer'));
    await userEvent.click(within(form).getByTestId('create-user-submit'));

    expect((await screen.findByTestId('temporary-password')).textContent).toBe(
      'quartz-heron-ladle-sprig',
    );
    // the shared schema trims and lower-cases the username, as the gateway stores it
    expect(sent(calls, 'POST', '/api/users').map((c) => c.body)).toEqual([
      { username: 'wren.ashby', displayName: 'Wren Ashby', roles: ['operator', 'reviewer'] },
    ]);
  });

  it('disables an account with PATCH disabled: true', async () => {
    const calls = await asAdmin(true, {
      'PATCH /api/users/u-op': user({ disabled: true }),
    });
    await userEvent.click(screen.getByTestId('user-operator-disable'));
    await userEvent.click(await screen.findByTestId('account-action-confirm'));
    await waitFor(() =>
      expect(sent(calls, 'PATCH', '/api/users/u-op').map((c) => c.body)).toEqual([
        { disabled: true },
      ]),
    );
  });

  it('resets a password, offering to remove a lost second factor', async () => {
    const calls = await asAdmin(true, {
      'POST /api/users/u-rev/reset-password': { temporaryPassword: 'ember-flint-otter-mosaic' },
    });
    await userEvent.click(screen.getByTestId('user-reviewer-reset'));
    await userEvent.click(await screen.findByLabelText(/Also remove the second factor/));
    await userEvent.click(screen.getByTestId('account-action-confirm'));
    expect((await screen.findByTestId('temporary-password')).textContent).toBe(
      'ember-flint-otter-mosaic',
    );
    expect(sent(calls, 'POST', '/api/users/u-rev/reset-password').map((c) => c.body)).toEqual([
      { removeTotp: true },
    ]);
  });

  it('edits roles, refusing none, and asks for the password when the gateway wants a step-up', async () => {
    const calls = await asAdmin(false, {
      'POST /api/auth/step-up': { stepUpUntil: new Date(Date.now() + 300_000).toISOString() },
      'PATCH /api/users/u-op': (c: Call) => user({ ...(c.body as object) }),
    });
    await userEvent.click(screen.getByTestId('user-operator-roles'));
    const form = await screen.findByTestId('edit-roles');
    await userEvent.click(within(form).getByLabelText('Operator'));
    await userEvent.click(within(form).getByRole('button', { name: 'Save' }));
    expect(await within(form).findByText('at least one role')).toBeTruthy();

    await userEvent.click(within(form).getByLabelText('Duty engineer'));
    await userEvent.click(within(form).getByRole('button', { name: 'Save' }));
    // no step-up yet in this session: the password first
    await userEvent.type(await screen.findByTestId('step-up-password'), 'the-weir-at-arnsey-mill');
    await userEvent.click(screen.getByTestId('step-up-confirm'));
    await waitFor(() =>
      expect(sent(calls, 'PATCH', '/api/users/u-op').map((c) => c.body)).toEqual([
        { roles: ['engineer'] },
      ]),
    );
    expect(sent(calls, 'POST', '/api/auth/step-up').map((c) => c.body)).toEqual([
      { password: 'the-weir-at-arnsey-mill' },
    ]);
  });
});
