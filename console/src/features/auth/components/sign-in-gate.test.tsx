import { useQuery } from '@tanstack/react-query';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { permissionsOf, type Me } from '@stillwell/shared/access';
import { z } from 'zod';
import { AppProvider } from '../../../app/provider';
import { apiGet } from '../../../lib/api-client';
import { signOut } from '../../../lib/auth-session';
import { FakeLiveSocket } from '../../../testing/fake-live-socket';
import { stubApi, type Call } from '../../../testing/orders-fixtures';
import { createTestQueryClient } from '../../../testing/render-app';
import { SignInGate } from './sign-in-gate';

const me = (over: Partial<Me> = {}): Me => ({
  id: 'u-new',
  username: 'wren.ashby',
  displayName: 'Wren Ashby',
  roles: ['operator'],
  permissions: permissionsOf(['operator']),
  sessionId: 's9',
  stepUpUntil: null,
  totpEnabled: false,
  mustChangePassword: false,
  ...over,
});
const token = (m: Me) => ({
  accessToken: 'token',
  expiresAt: new Date(Date.now() + 900_000).toISOString(),
  me: m,
});
const refusal = (status: number, code: string, extra: object = {}) =>
  Response.json({ statusCode: status, code, message: code, ...extra }, { status });

/** A screen behind the gate that fetches as soon as it mounts. */
function ControlRoom() {
  const zones = useQuery({
    queryKey: ['probe'],
    queryFn: () => apiGet('/api/probe', z.object({ name: z.string() })),
  });
  return <p>the control room{zones.data && `: ${zones.data.name}`}</p>;
}

function renderGate() {
  return render(
    <AppProvider queryClient={createTestQueryClient()} socket={new FakeLiveSocket()}>
      <SignInGate>
        <ControlRoom />
      </SignInGate>
    </AppProvider>,
  );
}

async function fillSignIn(username: string, password: string) {
  await userEvent.type(await screen.findByLabelText(/Username/), username);
  await userEvent.type(screen.getByLabelText(/Password/), password);
  await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
}

afterEach(async () => {
  await signOut();
});

describe('the sign-in page', () => {
  it('says when the password is wrong, asks for the code when the account has one, then opens', async () => {
    const calls = stubApi({
      'POST /api/auth/refresh': refusal(401, 'refresh-invalid'),
      'GET /api/auth/me': refusal(401, 'unauthenticated'),
      'POST /api/auth/sign-in': (c: Call, n: number) =>
        n === 1
          ? refusal(401, 'invalid-credentials')
          : (c.body as { totp?: string }).totp
            ? token(me({ totpEnabled: true }))
            : refusal(401, 'totp-required'),
      'GET /api/probe': { name: 'Lake Orrin' },
    });
    renderGate();
    await fillSignIn('wren.ashby', 'wrong');
    expect((await screen.findByRole('alert')).textContent).toMatch(/not right/);
    expect(screen.queryByLabelText('Authenticator code')).toBeNull();

    await userEvent.clear(screen.getByLabelText(/Password/));
    await userEvent.type(screen.getByLabelText(/Password/), 'marsh-lantern-velvet');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await userEvent.type(await screen.findByLabelText('Authenticator code'), '492039');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    // the screens behind the gate load what they fetch once signed in
    expect(await screen.findByText('the control room: Lake Orrin')).toBeTruthy();
    expect(calls.filter((c) => c.path === '/api/auth/sign-in').map((c) => c.body)).toEqual([
      { username: 'wren.ashby', password: 'wrong' },
      { username: 'wren.ashby', password: 'marsh-lantern-velvet' },
      { username: 'wren.ashby', password: 'marsh-lantern-velvet', totp: '492039' },
    ]);
  });

  it('resumes a session from the refresh cookie without asking', async () => {
    stubApi({ 'POST /api/auth/refresh': token(me()) });
    renderGate();
    expect(await screen.findByText(/the control room/)).toBeTruthy();
  });

  it('after a temporary password, asks for one of their own under the shared rules before anything opens', async () => {
    let changed = false;
    const calls = stubApi({
      'POST /api/auth/refresh': token(me({ mustChangePassword: true })),
      'POST /api/auth/password': (c: Call) =>
        (c.body as { newPassword: string }).newPassword === 'password-password'
          ? refusal(400, 'password-rejected', { problems: ['common'] })
          : ((changed = true), new Response(null, { status: 204 })),
      'GET /api/auth/me': () => me({ mustChangePassword: !changed }),
    });
    renderGate();
    const form = await screen.findByTestId('first-password');
    expect(screen.queryByText(/the control room/)).toBeNull();
    const [temporary, fresh, again] = [
      screen.getByLabelText(/Temporary password/),
      screen.getByLabelText(/^New password$/),
      screen.getByLabelText(/New password again/),
    ];
    await userEvent.type(temporary!, 'quartz-heron-ladle-sprig');

    // the shared rules (NIST SP 800-63B 5.1.1.2) refuse in the browser, before any request
    await userEvent.type(fresh!, 'tidal');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));
    expect((await screen.findByTestId('new-password-help')).textContent).toBe(
      'at least 8 characters',
    );
    await userEvent.clear(fresh!);
    await userEvent.type(fresh!, '123456789');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));
    await waitFor(() =>
      expect(screen.getByTestId('new-password-help').textContent).toMatch(/simple run/),
    );
    await userEvent.clear(fresh!);
    await userEvent.type(fresh!, 'wren.ashby-at-orrin');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));
    await waitFor(() =>
      expect(screen.getByTestId('new-password-help').textContent).toBe('contains the username'),
    );
    expect(form.textContent).toMatch(/the two new passwords differ/);
    expect(calls.filter((c) => c.path === '/api/auth/password')).toHaveLength(0);

    // the common-password list is the gateway's: its refusal is shown in the same words
    await userEvent.clear(fresh!);
    await userEvent.type(fresh!, 'password-password');
    await userEvent.type(again!, 'password-password');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));
    await waitFor(() =>
      expect(screen.getByTestId('new-password-help').textContent).toBe(
        'on the list of commonly used passwords',
      ),
    );

    await userEvent.clear(fresh!);
    await userEvent.clear(again!);
    await userEvent.type(fresh!, 'copper-reeds-below-the-weir');
    await userEvent.type(again!, 'copper-reeds-below-the-weir');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));
    expect(await screen.findByText(/the control room/)).toBeTruthy();
    expect(calls.filter((c) => c.path === '/api/auth/password').at(-1)?.body).toEqual({
      currentPassword: 'quartz-heron-ladle-sprig',
      newPassword: 'copper-reeds-below-the-weir',
    });
  });

  it('asks 15 characters of an administrator', async () => {
    stubApi({
      'POST /api/auth/refresh': token(me({ roles: ['admin'], mustChangePassword: true })),
    });
    renderGate();
    await userEvent.type(await screen.findByLabelText(/Temporary password/), 'x');
    await userEvent.type(screen.getByLabelText(/^New password$/), 'fourteen-chars');
    await userEvent.click(screen.getByRole('button', { name: 'Change password' }));
    await waitFor(() =>
      expect(screen.getByTestId('new-password-help').textContent).toBe('at least 15 characters'),
    );
  });
});
