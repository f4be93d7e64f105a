import { render, screen, waitFor, within } from '@testing-library/react';
import { QueryClient } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { permissionsOf, type Role } from '@stillwell/shared/access';
import type { ImportResult, MyRelease, Notice, Recipient } from '@stillwell/shared/notices';
import { definition, makeStatus, SITE_NOW } from '../../../testing/fixtures';
import { AppProvider } from '../../../app/provider';
import { DownstreamRoute, MyReleasesRoute, NoticesRoute } from '../../../app/routes/notices';
import { signIn, signOut } from '../../../lib/auth-session';
import { FakeLiveSocket } from '../../../testing/fake-live-socket';
import { stubFetch, type RouteAnswer } from '../../../testing/stub-fetch';

const base = `/api/reservoirs/${definition.id}`;

const recipient = (over: Partial<Recipient>): Recipient => ({
  id: 'r-1',
  contactId: 'c-1',
  organisation: 'Hessford Emergency Management',
  person: 'Dorran Pike',
  role: 'duty officer',
  email: 'duty.officer@hessford-em.example',
  phone: '+44 1632 960 301',
  chainLevel: 1,
  reason: 'first-call',
  delivery: 'not-sent',
  standing: 'waiting',
  sentAt: null,
  deliveredAt: null,
  bouncedAt: null,
  bounceReason: null,
  acknowledgedAt: null,
  acknowledgedVia: null,
  ackDueAt: null,
  escalatedAt: null,
  leadTimeS: 7200,
  leadTimeRunsAt: null,
  ...over,
});

const notice = (over: Partial<Notice> = {}): Notice => ({
  id: 'n-1',
  reservoirId: definition.id,
  orderId: '7',
  zoneId: 'z-1',
  zoneName: 'Hessford',
  distanceM: 14_000,
  affectedAtM3s: 700,
  state: 'prepared',
  emergency: false,
  releaseM3s: 800,
  previousReleaseM3s: 40,
  startAt: SITE_NOW + 3 * 3600_000,
  arrivalAt: SITE_NOW + 5.2 * 3600_000,
  durationS: null,
  travelTimeS: 7920,
  beyondTable: null,
  subject: 'Release notice',
  template: 'To {{person}}',
  preview: 'To Dorran Pike\n\nExpected release: 800 m3/s (28,252 cfs)',
  preparedAt: SITE_NOW,
  sentAt: null,
  sentBy: null,
  recipients: [recipient({})],
  ...over,
});

/** The request made to a path, as fetch was given it (the stub's type knows only the URL). */
function requestTo(
  stub: ReturnType<typeof stubFetch>['fetchStub'],
  suffix: string,
): RequestInit | undefined {
  const call = (stub.mock.calls as unknown as Array<[RequestInfo | URL, RequestInit?]>).find(
    ([url]) => String(url).endsWith(suffix),
  );
  return call?.[1];
}

/** The notices routes alone, so these tests stand apart from the other screens of the console. */
function renderApp(path: string) {
  const router = createMemoryRouter(
    [
      { path: '/reservoirs/:reservoirId/notices', element: <NoticesRoute /> },
      { path: '/reservoirs/:reservoirId/downstream', element: <DownstreamRoute /> },
      { path: '/my-releases', element: <MyReleasesRoute /> },
    ],
    { initialEntries: [path] },
  );
  return render(
    <AppProvider
      queryClient={new QueryClient({ defaultOptions: { queries: { retry: false } } })}
      socket={new FakeLiveSocket()}
    >
      <RouterProvider router={router} />
    </AppProvider>,
  );
}

function gateway(extra: Record<string, RouteAnswer>) {
  return stubFetch({
    '/api/reservoirs': [
      {
        id: definition.id,
        name: definition.name,
        damName: definition.damName,
        timeZone: definition.timeZone,
        version: 1,
      },
    ],
    [base]: { version: 1, definition },
    [`${base}/status`]: makeStatus(),
    ...extra,
  });
}

// MUI dialogs and the data grid take a few seconds to render in jsdom on a busy machine
describe('downstream notices screens', { timeout: 20_000 }, () => {
  it('shows who is to be told, sends the notice, and then who has been told, acknowledged or is silent', async () => {
    let sent = false;
    const told = notice({
      state: 'sent',
      recipients: [
        recipient({
          delivery: 'delivered',
          standing: 'acknowledged',
          acknowledgedAt: SITE_NOW + 60_000,
        }),
        recipient({
          id: 'r-2',
          person: 'Alys Fenwick',
          delivery: 'delivered',
          standing: 'silent',
          chainLevel: 2,
        }),
      ],
    });
    const { fetchStub } = gateway({
      [`${base}/notices`]: () => [sent ? told : notice()],
      '/api/notices/n-1/send': () => {
        sent = true;
        return told;
      },
    });
    renderApp(`/reservoirs/${definition.id}/notices`);
    const card = await screen.findByTestId('notice-Hessford');
    expect(card.dataset.state).toBe('prepared');
    expect(within(card).getByText('800 m3/s (28,252 cfs)')).toBeTruthy();
    expect(within(card).getByTestId('recipient-Dorran Pike').dataset.standing).toBe('waiting');

    await userEvent.click(within(card).getByRole('button', { name: 'Send to 1 contact' }));
    await waitFor(() => expect(screen.getByTestId('notice-Hessford').dataset.state).toBe('sent'));
    expect(requestTo(fetchStub, '/api/notices/n-1/send')?.method).toBe('POST');
    expect(screen.getByTestId('recipient-Alys Fenwick').dataset.standing).toBe('silent');
    expect(screen.getByTestId('counts-7').textContent).toBe('2 told · 1 acknowledged · 1 silent');
  });

  it('lists every problem of a refused CSV import by row and column', async () => {
    const refused: ImportResult = {
      imported: 0,
      problems: [
        { row: 3, column: 'zone', message: `row 3, column 'zone': no zone "Nowhere"` },
        {
          row: 4,
          column: 'email',
          message: `row 4, column 'email': not an e-mail address ("coach-at-rowing")`,
        },
      ],
    };
    const { fetchStub } = gateway({
      [`${base}/zones`]: [],
      [`${base}/contacts`]: [],
      [`${base}/contacts/import`]: refused,
    });
    renderApp(`/reservoirs/${definition.id}/downstream`);
    await userEvent.click(await screen.findByRole('button', { name: 'Import CSV' }));
    await userEvent.click(screen.getByLabelText('CSV text'));
    await userEvent.paste('zone,organisation');
    await userEvent.click(screen.getByRole('button', { name: 'Import' }));
    const list = await screen.findByTestId('import-problems');
    expect([...list.querySelectorAll('li')].map((li) => li.textContent)).toEqual(
      refused.problems.map((p) => p.message),
    );
    expect(JSON.parse(String(requestTo(fetchStub, '/contacts/import')?.body))).toEqual({
      csv: 'zone,organisation',
    });
  });

  it('refuses a contact the gateway would refuse, naming the field, before anything is sent', async () => {
    const zone = {
      id: 'z-1',
      reservoirId: definition.id,
      name: 'Hessford',
      kind: 'town',
      distanceM: 14_000,
      affectedAtM3s: 700,
      travelTimes: [{ releaseM3s: 500, travelTimeS: 9000 }],
      contactCount: 0,
      updatedAt: 0,
    };
    const { fetchStub } = gateway({ [`${base}/zones`]: [zone], [`${base}/contacts`]: [] });
    renderApp(`/reservoirs/${definition.id}/downstream`);
    await userEvent.click(await screen.findByRole('button', { name: 'Add a contact' }));
    const fill = async (label: string, text: string) => {
      await userEvent.click(screen.getByLabelText(label));
      await userEvent.paste(text);
    };
    await fill('Organisation', 'Hessford Rowing Club');
    await fill('Person', 'Mo Kettering');
    await fill('Role', 'captain');
    await fill('E-mail', 'captain-at-the-club');
    await fill('Phone', '+44 1632 960 310');
    await userEvent.click(screen.getByRole('button', { name: 'Save contact' }));
    expect(await screen.findByText('not an e-mail address')).toBeTruthy();
    expect(screen.queryByText('not a phone number')).toBeNull();
    const posts = (fetchStub.mock.calls as unknown as Array<[unknown, RequestInit?]>).filter(
      ([, init]) => init?.method === 'POST',
    );
    expect(posts).toEqual([]);
  });

  it('shows a stakeholder the releases coming to their zone and records their acknowledgement', async () => {
    let acknowledged: number | null = null;
    const mine = (): MyRelease[] => [
      {
        recipientId: 'r-1',
        noticeId: 'n-1',
        reservoirId: definition.id,
        damName: 'Orrin Gap Dam',
        timeZone: 'Europe/London',
        zoneName: 'Hessford',
        organisation: 'Hessford Emergency Management',
        releaseM3s: 800,
        startAt: SITE_NOW + 3 * 3600_000,
        arrivalAt: SITE_NOW + 5 * 3600_000,
        durationS: null,
        phase: 'upcoming',
        message: 'Expected release: 800 m3/s',
        acknowledgedAt: acknowledged,
        emergency: false,
      },
    ];
    gateway({
      '/api/notices/mine': mine,
      '/api/notices/mine/r-1/acknowledge': () => {
        acknowledged = SITE_NOW + 1000;
        return { recorded: true, acknowledgedAt: acknowledged };
      },
    });
    renderApp('/my-releases');
    await userEvent.click(await screen.findByRole('button', { name: 'Acknowledge' }));
    expect((await screen.findByTestId('acknowledged-at')).textContent).toMatch(/^Acknowledged /);
  });

  describe('what each role is offered (the shared permission matrix; the gateway decides)', () => {
    afterEach(async () => {
      await signOut();
    });
    /** Signs in through the session module, the sign-in answered by the stub with these roles. */
    async function signedInAs(role: Role, routes: Record<string, RouteAnswer>) {
      const me = {
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
      const stub = gateway({
        '/api/auth/sign-in': {
          accessToken: `token-${role}`,
          expiresAt: new Date(Date.now() + 900_000).toISOString(),
          me,
        },
        '/api/auth/sign-out': new Response(null, { status: 204 }),
        ...routes,
      });
      expect(await signIn(role, 'any-password')).toBeNull();
      return stub;
    }

    it('shows an operator the notices but no Send or wording buttons, and says who sends', async () => {
      await signedInAs('operator', { [`${base}/notices`]: [notice()] });
      renderApp(`/reservoirs/${definition.id}/notices`);
      const card = await screen.findByTestId('notice-Hessford');
      expect(within(card).queryByRole('button', { name: /^Send to / })).toBeNull();
      expect(within(card).queryByRole('button', { name: 'Edit wording' })).toBeNull();
      expect(card.textContent).toMatch(/The downstream liaison or the duty engineer sends it/);
    });

    it('offers the duty engineer Send and the zones, but leaves the contact list to the liaison', async () => {
      const { calls } = await signedInAs('engineer', {
        [`${base}/notices`]: [notice()],
        [`${base}/zones`]: [],
      });
      renderApp(`/reservoirs/${definition.id}/notices`);
      const card = await screen.findByTestId('notice-Hessford');
      expect(within(card).getByRole('button', { name: 'Send to 1 contact' })).toBeTruthy();
      renderApp(`/reservoirs/${definition.id}/downstream`);
      expect(await screen.findByRole('button', { name: 'Add a zone' })).toBeTruthy();
      expect(screen.getByText('The downstream liaison keeps the list of contacts.')).toBeTruthy();
      expect(screen.queryByRole('button', { name: 'Import CSV' })).toBeNull();
      // the list it may not read is not even asked for
      expect(calls.some((u) => u.pathname === `${base}/contacts`)).toBe(false);
    });
  });
});
