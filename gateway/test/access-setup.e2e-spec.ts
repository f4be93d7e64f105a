import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { createAdmin } from '../src/cli/create-admin-command';
import { validateEnv } from '../src/config';
import { ACCESS_TEST_ENV, signIn } from './support/auth';
import { startTestGateway, type TestGateway } from './support/gateway';

describe('outside demo mode: no accounts until the one-time setup command', () => {
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-setup-'));
  const databasePath = join(dir, 'production.sqlite');
  const env = {
    ...ACCESS_TEST_ENV,
    DEMO_MODE: 'false',
    DATABASE_PATH: databasePath,
    MQTT_URL: 'mqtt://127.0.0.1:9',
  };
  let gateway: TestGateway | undefined;

  beforeAll(() => Object.assign(process.env, env));
  afterAll(async () => {
    await gateway?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('refuses to start without JWT_SECRET outside demo mode', () => {
    expect(() => validateEnv({ DEMO_MODE: 'false' })).toThrow(
      /JWT_SECRET: required outside demo mode/,
    );
    expect(() => validateEnv({ DEMO_MODE: 'false', JWT_SECRET: 'short' })).toThrow(/JWT_SECRET/);
    expect(validateEnv({ DEMO_MODE: 'true' }).JWT_SECRET).toBeUndefined();
  });

  it('refuses a weak password, creates the administrator once, then refuses a second', async () => {
    await expect(
      createAdmin({ username: 'sefton.marr', password: 'short-password' }),
    ).rejects.toThrow(/password rules: at least 15 characters$/);
    await expect(
      createAdmin({ username: 'sefton.marr', password: '1qaz2wsx3edc4rfv' }),
    ).rejects.toThrow(/on the list of commonly used passwords/);
    await expect(
      createAdmin({ username: 'Not A Name!', password: 'the-weir-at-arnsey-mill' }),
    ).rejects.toThrow(/--username/);
    const line = await createAdmin({
      username: 'Sefton.Marr',
      displayName: 'Sefton Marr',
      password: 'the-weir-at-arnsey-mill',
    });
    expect(line).toMatch(/Created administrator "sefton.marr"/);
    await expect(
      createAdmin({ username: 'someone.else', password: 'another-long-passphrase' }),
    ).rejects.toThrow(/An administrator exists already/);
  });

  it('refuses to run in demo mode, which has accounts of its own', async () => {
    process.env.DEMO_MODE = 'true';
    try {
      await expect(
        createAdmin({ username: 'x-admin', password: 'the-weir-at-arnsey-mill' }),
      ).rejects.toThrow(/DEMO_MODE/);
    } finally {
      process.env.DEMO_MODE = 'false';
    }
  });

  it('starts the gateway with that administrator and no demo accounts', async () => {
    gateway = await startTestGateway({ ...env });
    const bad = await request(gateway.url)
      .post('/api/auth/sign-in')
      .send({ username: 'admin', password: 'anything-at-all' });
    expect(bad.body.code).toBe('invalid-credentials');
    const admin = await signIn(gateway, 'sefton.marr', 'the-weir-at-arnsey-mill');
    expect(admin.me.roles).toEqual(['admin']);
    const users = await request(gateway.url)
      .get('/api/users')
      .set('Authorization', `Bearer ${admin.token}`)
      .expect(200);
    expect(users.body.map((u: { username: string }) => u.username)).toEqual(['sefton.marr']);
  });
});
