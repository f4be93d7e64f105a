import request from 'supertest';
import type { Notice } from '@stillwell/shared/notices';
import { SiteClockService } from '../../src/clock/site-clock.service';
import { LogbookService } from '../../src/logbook/logbook.service';
import { ACCESS_TEST_ENV, signInAs, type SignedInUser } from './auth';
import { startTestBroker, type TestBroker } from './broker';
import { startTestGateway, type TestGateway } from './gateway';

export const RESERVOIR = 'lake-orrin';
/** a plant time for the tests to start from; the site clock is set to it, then moved by hand */
export const T0 = Date.parse('2026-12-01T10:00:00.000Z');

export interface NoticesRig {
  broker: TestBroker;
  gateway: TestGateway;
  liaison: SignedInUser;
  stop(): Promise<void>;
}

/** A real broker and gateway in demo mode (demo zones, contacts and mail server), timers off. */
export async function startNoticesRig(env: Record<string, string> = {}): Promise<NoticesRig> {
  const broker = await startTestBroker();
  const gateway = await startTestGateway({
    MQTT_URL: broker.url,
    ...ACCESS_TEST_ENV,
    NOTICE_TICK_MS: '0',
    DEMO_SMTP_PORT: '0',
    ...env,
  });
  setSiteTime(gateway, T0);
  const liaison = await signInAs(gateway, 'liaison');
  return {
    broker,
    gateway,
    liaison,
    stop: async () => {
      await gateway.close();
      await broker.stop();
    },
  };
}

/**
 * Sets the site clock as the simulator would, by its clock message, at a speed so slow that the
 * plant clock stands still: a test moves time on by setting it again, never by waiting.
 */
export function setSiteTime(gateway: TestGateway, ms: number): void {
  gateway.app
    .get(SiteClockService)
    .accept(
      `stillwell/v1/${RESERVOIR}/clock`,
      Buffer.from(JSON.stringify({ siteTime: new Date(ms).toISOString(), speed: 1e-6 })),
    );
}

export const api = (gateway: TestGateway, user: SignedInUser) => ({
  get: (path: string) =>
    request(gateway.url).get(path).set('Authorization', `Bearer ${user.token}`),
  post: (path: string, body: object = {}) =>
    request(gateway.url).post(path).set('Authorization', `Bearer ${user.token}`).send(body),
  put: (path: string, body: object) =>
    request(gateway.url).put(path).set('Authorization', `Bearer ${user.token}`).send(body),
});

export async function prepare(
  rig: NoticesRig,
  orderId: string,
  targetReleaseM3s: number,
  extra: {
    currentReleaseM3s?: number | null;
    plannedStartAt?: number | null;
    durationS?: number | null;
  } = {},
): Promise<Notice[]> {
  const res = await api(rig.gateway, rig.liaison)
    .post(`/api/reservoirs/${RESERVOIR}/notices/prepare`, {
      orderId,
      targetReleaseM3s,
      currentReleaseM3s: extra.currentReleaseM3s ?? 40,
      plannedStartAt: extra.plannedStartAt ?? null,
      durationS: extra.durationS ?? null,
    })
    .expect(200);
  return res.body as Notice[];
}

/** Logbook entries of some kinds, oldest first. */
export async function entries(gateway: TestGateway, ...kinds: string[]) {
  const all = await gateway.app.get(LogbookService).after(0, 100_000);
  return all.filter((e) => kinds.includes(e.kind));
}
