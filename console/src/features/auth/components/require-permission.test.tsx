import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { permissionsOf, type Me, type Role } from '@stillwell/shared/access';
import { session, signIn, signOut } from '../../../lib/auth-session';
import { definition, makeStatus } from '../../../testing/fixtures';
import { stubApi } from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

function meAs(roles: Role[], displayName: string): Me {
  return {
    id: `u-${roles[0]}`,
    username: roles[0]!,
    displayName,
    roles,
    permissions: permissionsOf(roles),
    sessionId: 's1',
    stepUpUntil: null,
    totpEnabled: false,
    mustChangePassword: false,
  };
}

const token = (me: Me) => ({
  accessToken: `token-${me.username}`,
  expiresAt: new Date(Date.now() + 900_000).toISOString(),
  me,
});

const base = `/api/reservoirs/${definition.id}`;

/** Signs in through the session module (the sign-in call answered by the stub), then the gateway's answers. */
async function signedInAs(me: Me, routes: Record<string, unknown> = {}) {
  const calls = stubApi({
    'POST /api/auth/sign-in': token(me),
    'POST /api/auth/sign-out': new Response(null, { status: 204 }),
    [`GET ${base}`]: { version: 3, definition },
    [`GET ${base}/status`]: makeStatus(),
    'GET /api/users': [],
    ...routes,
  });
  expect(await signIn(me.username, 'any-password')).toBeNull();
  return calls;
}

afterEach(async () => {
  await signOut();
});

describe('route guards and the shell, by the shared permission matrix', () => {
  it('refuses the users page to an operator with a clear screen, and shows no link to it', async () => {
    await signedInAs(meAs(['operator'], 'Mara Quill'));
    renderApp('/users');
    const refusal = await screen.findByTestId('not-allowed');
    expect(refusal.textContent).toMatch(/Not allowed/);
    expect(refusal.textContent).toMatch(/create users, change roles/);
    expect(refusal.textContent).toMatch(/Your roles \(Operator\)/);
    expect(screen.queryByTestId('users-grid')).toBeNull();

    const who = screen.getByTestId('signed-in-as');
    expect(who.textContent).toMatch(/Signed in as\s*Mara Quill/);
    expect(within(who).getByText('Operator')).toBeTruthy();
    expect(within(who).getByRole('link', { name: 'Profile' })).toBeTruthy();
    expect(within(who).queryByRole('link', { name: 'Users' })).toBeNull();
  });

  it('opens the users page to an administrator, with the link in the shell', async () => {
    const calls = await signedInAs(meAs(['admin'], 'Sefton Marr'));
    renderApp('/users');
    await screen.findByTestId('users-grid');
    expect(screen.queryByTestId('not-allowed')).toBeNull();
    const who = screen.getByTestId('signed-in-as');
    expect(within(who).getByRole('link', { name: 'Users' }).getAttribute('href')).toBe('/users');
    expect(within(who).getByText('Administrator')).toBeTruthy();
    // the API client sent the session's token
    expect(calls.some((c) => c.method === 'GET' && c.path === '/api/users')).toBe(true);
  });

  it('hides the reservoir screens the roles cannot read and refuses them when typed', async () => {
    await signedInAs(meAs(['operator'], 'Mara Quill'));
    renderApp(`/reservoirs/${definition.id}/outbox`);
    expect((await screen.findByTestId('not-allowed')).textContent).toMatch(
      /send a downstream notice/,
    );
    const nav = screen.getByRole('navigation', { name: 'Screens' });
    const links = within(nav)
      .getAllByRole('link')
      .map((a) => a.textContent);
    expect(links).toContain('Alarms');
    expect(links).toContain('Gate orders');
    expect(links).not.toContain('Demo outbox');
    expect(links).not.toContain('Downstream');
  });

  it('shows every role a person holds, and the union of what they allow', async () => {
    await signedInAs(meAs(['liaison', 'reviewer'], 'Ines Varga'));
    renderApp(`/reservoirs/${definition.id}/outbox`);
    const who = await screen.findByTestId('signed-in-as');
    expect(within(who).getByText('Downstream liaison')).toBeTruthy();
    expect(within(who).getByText('Reviewer')).toBeTruthy();
    // the liaison may send notices, so the outbox opens
    await waitFor(() => expect(screen.queryByTestId('not-allowed')).toBeNull());
    const nav = screen.getByRole('navigation', { name: 'Screens' });
    expect(within(nav).getByRole('link', { name: 'Demo outbox' })).toBeTruthy();
  });

  it('signs out: the gateway is told and the session is gone', async () => {
    const calls = await signedInAs(meAs(['operator'], 'Mara Quill'));
    renderApp('/profile');
    await userEvent.click(await screen.findByRole('button', { name: 'Sign out' }));
    await waitFor(() => expect(session()).toBeNull());
    const out = calls.find((c) => c.path === '/api/auth/sign-out');
    expect(out?.method).toBe('POST');
  });
});
