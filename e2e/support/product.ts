import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { demoPassword } from './browser.ts';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
  });
}

export interface RunningProduct {
  url: string;
  output: () => string;
  stop(): Promise<number | null>;
}

/**
 * Starts the product as `npm start` does (scripts/start.mjs), on free ports and a temporary database.
 * `env` adds gateway settings (e.g. a longer grace where a fast simulator meets a loaded machine).
 */
export async function startProduct(
  simulatorArgs: string[] = [],
  env: Record<string, string> = {},
): Promise<RunningProduct> {
  const [port, mqttPort] = [await freePort(), await freePort()];
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-e2e-'));
  let log = '';
  const child: ChildProcess = spawn(
    process.execPath,
    [join(root, 'scripts/start.mjs'), ...simulatorArgs],
    {
      env: {
        ...process.env,
        PORT: String(port),
        MQTT_PORT: String(mqttPort),
        DATABASE_PATH: join(dir, 'stillwell.sqlite'),
        MQTT_CLIENT_ID: `stillwell-e2e-${process.pid}`,
        ...env,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  child.stdout!.on('data', (d: Buffer) => (log += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (log += d.toString()));
  const url = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the product exited early:\n${log}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error(`the product did not become healthy:\n${log}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return {
    url,
    output: () => log,
    stop: () =>
      new Promise((resolve) => {
        const done = (code: number | null) => {
          rmSync(dir, { recursive: true, force: true });
          resolve(code);
        };
        if (child.exitCode !== null) return done(child.exitCode);
        child.once('exit', (code) => done(code));
        child.kill('SIGINT');
      }),
  };
}

/** Signs a demo user in through the API with the password the product printed at start. */
export async function apiToken(product: RunningProduct, role: string): Promise<string> {
  const res = await fetch(`${product.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username: role, password: demoPassword(product.output(), role) }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${role}: ${res.status} ${await res.text()}`);
  return ((await res.json()) as { accessToken: string }).accessToken;
}
