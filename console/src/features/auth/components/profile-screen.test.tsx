import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { permissionsOf, type Me, type SessionInfo } from '@stillwell/shared/access';
import { signIn, signOut } from '../../../lib/auth-session';
import { stubApi, type Call } from '../../../testing/orders-fixtures';
import { renderApp } from '../../../testing/render-app';

const me = (over: Partial<Me> = {}): Me => ({
  id: 'u-eng',
  username: 'engineer',
  displayName: 'Tobin Hale',
  roles: ['engineer'],
  permissions: permissionsOf(['engineer']),
  sessionId: 's1',
  stepUpUntil: null,
  totpEnabled: false,
  mustChangePassword: false,
  ...over,
});

const session = (id: string, current: boolean, userAgent: string): SessionInfo => ({
  id,
  createdAt: '2026-03-03T06:00:00.000Z',
  lastRefreshedAt: '2026-03-03T13:45:00.000Z',
  expiresAt: '2026-03-03T18:00:00.000Z',
  userAgent,
  ip: current ? '10.0.4.7' : '10.0.9.12',
  current,
});

const noContent = () => new Response(null, { status: 204 });
const QR = 'data:image/png;base64,iVBORw0KGgo=';

async function profileOf(routes: Record<string, unknown>) {
  const calls = stubApi({
    'POST /api/auth/sign-in': {
      accessToken: 'token-engineer',
      expiresAt: new Date(Date.now() + 900_000).toISOString(),
      me: me(),
    },
    'GET /api/auth/sessions': [
      session('s1', true, 'Mozilla/5.0 (X11; Linux x86_64) Chrome/140.0 Safari/537.36'),
      session('s2', false, 'Mozilla/5.0 (Windows NT 10.0; rv:128.0) Gecko/20100101 Firefox/128.0'),
    ],
    ...routes,
  });
  await signIn('engineer', 'marsh-lantern-velvet');
  renderApp('/profile');
  return calls;
}

afterEach(async () => {
  await signOut();
});

describe('the profile page', () => {
  it("lists one's sessions and ends another one", async () => {
    const calls = await profileOf({ 'DELETE /api/auth/sessions/s2': noContent });
    const table = await screen.findByTestId('sessions');
    const mine = within(table).getByTestId('session-s1');
    expect(mine.textContent).toMatch(/Chrome on Linux/);
    expect(within(mine).getByText('This session')).toBeTruthy();
    expect(within(mine).queryByRole('button', { name: 'End' })).toBeNull();
    const other = within(table).getByTestId('session-s2');
    expect(other.textContent).toMatch(/Firefox on Windows/);
    await userEvent.click(within(other).getByRole('button', { name: 'End' }));
    await waitFor(() =>
      expect(calls.filter((c) => c.method === 'DELETE').map((c) => c.path)).toEqual([
        '/api/auth/sessions/s2',
      ]),
    );
    // the list is read again after the change
    await waitFor(() =>
      expect(calls.filter((c) => c.path === '/api/auth/sessions').length).toBeGreaterThan(1),
    );
  });

  it('adds an authenticator: password again, then the QR code, then a code from it', async () => {
    let enabled = false;
    const calls = await profileOf({
      'POST /api/auth/step-up': { stepUpUntil: new Date(Date.now() + 300_000).toISOString() },
      'POST /api/auth/totp/begin': {
        secret: 'JBSWY3DPEHPK3PXPJBSWY3DPEHPK3PXP',
        uri: 'otpauth://totp/Stillwell:engineer?secret=JBSWY3DPEHPK3PXPJBSWY3DPEHPK3PXP',
        qrDataUrl: QR,
        algorithm: 'SHA1',
        digits: 6,
        period: 30,
      },
      'POST /api/auth/totp/confirm': () => ((enabled = true), noContent()),
      'GET /api/auth/me': () => me({ totpEnabled: enabled }),
    });
    await userEvent.click(await screen.findByTestId('totp-begin'));
    await userEvent.type(await screen.findByTestId('step-up-password'), 'marsh-lantern-velvet');
    await userEvent.click(screen.getByTestId('step-up-confirm'));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());

    const qr = await screen.findByTestId('totp-qr');
    expect(qr.getAttribute('src')).toBe(QR);
    expect(screen.getByTestId('totp-secret').textContent).toBe(
      'JBSW Y3DP EHPK 3PXP JBSW Y3DP EHPK 3PXP',
    );
    const code = screen.getByLabelText('Code from the app');
    await userEvent.type(code, '12345');
    await userEvent.click(screen.getByRole('button', { name: 'Turn on' }));
    expect(await screen.findByText('six digits', { selector: 'p.Mui-error' })).toBeTruthy();
    expect(calls.filter((c) => c.path === '/api/auth/totp/confirm')).toHaveLength(0);

    await userEvent.type(code, '6');
    await userEvent.click(screen.getByRole('button', { name: 'Turn on' }));
    expect(await screen.findByTestId('totp-on')).toBeTruthy();
    const order = calls
      .filter((c: Call) => c.method === 'POST' && c.path.startsWith('/api/auth/'))
      .map((c) => [c.path, c.body]);
    expect(order).toEqual([
      ['/api/auth/sign-in', { username: 'engineer', password: 'marsh-lantern-velvet' }],
      ['/api/auth/step-up', { password: 'marsh-lantern-velvet' }],
      ['/api/auth/totp/begin', undefined],
      ['/api/auth/totp/confirm', { code: '123456' }],
    ]);
  });
});
