import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { connect, createServer, type Server, type Socket } from 'node:net';
import { join } from 'node:path';

const ROOT = join(__dirname, '..', '..', '..');

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

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Polls until the check passes; past the deadline the check's own error fails the test. */
export async function waitFor<T>(
  what: string,
  check: () => T | Promise<T>,
  timeoutMs: number,
  everyMs = 200,
): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    try {
      return await check();
    } catch (error) {
      if (Date.now() > until) {
        throw new Error(`${what}: not within ${timeoutMs} ms: ${(error as Error).message}`, {
          cause: error,
        });
      }
      await sleep(everyMs);
    }
  }
}

/** A real child process (node on a built script), its output kept for the failure message. */
export class Child {
  private out = '';
  readonly exited: Promise<void>;

  private constructor(
    readonly name: string,
    readonly child: ChildProcess,
  ) {
    child.stdout!.on('data', (d: Buffer) => (this.out += d.toString()));
    child.stderr!.on('data', (d: Buffer) => (this.out += d.toString()));
    this.exited = new Promise((resolve) => child.once('exit', () => resolve()));
  }

  static node(name: string, args: string[], env: Record<string, string>): Child {
    const child = spawn(process.execPath, args, {
      cwd: ROOT,
      env: { ...process.env, ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    return new Child(name, child);
  }

  get output(): string {
    return this.out;
  }

  get running(): boolean {
    return this.child.exitCode === null && this.child.signalCode === null;
  }

  signal(signal: NodeJS.Signals): void {
    if (this.running) this.child.kill(signal);
  }

  /** Sends the signal and waits for the exit; SIGKILL after `graceMs`. */
  async stop(signal: NodeJS.Signals = 'SIGTERM', graceMs = 10_000): Promise<void> {
    if (!this.running) return;
    this.child.kill(signal);
    const timer = setTimeout(() => this.signal('SIGKILL'), graceMs);
    await this.exited;
    clearTimeout(timer);
  }

  async waitForOutput(pattern: RegExp, timeoutMs: number): Promise<RegExpExecArray> {
    return waitFor(
      `${this.name} to print ${pattern}`,
      () => {
        if (!this.running) throw new Error(`${this.name} exited:\n${this.out.slice(-4000)}`);
        const m = pattern.exec(this.out);
        if (!m) throw new Error(`output so far:\n${this.out.slice(-2000)}`);
        return m;
      },
      timeoutMs,
    );
  }
}

/** An aedes broker in its own process, in-memory sessions as shipped, on a chosen port. */
const BROKER_SCRIPT = `
import net from 'node:net';
import { Aedes } from 'aedes';
const broker = await Aedes.createBroker();
const server = net.createServer(broker.handle);
server.listen(Number(process.env.BROKER_PORT), '127.0.0.1', () => console.log('LISTENING'));
process.on('SIGTERM', () => { server.close(); broker.close(() => process.exit(0)); });
`;

export async function startBrokerProcess(port: number): Promise<Child> {
  const broker = Child.node('broker', ['--input-type=module', '-e', BROKER_SCRIPT], {
    BROKER_PORT: String(port),
  });
  // resolve aedes from the simulator, which depends on it
  await broker.waitForOutput(/LISTENING/, 20_000);
  return broker;
}

export interface GatewayProcess extends Child {
  url: string;
}

/** The built gateway (gateway/dist/main.js) as a process, healthy and connected to the broker. */
export async function startGatewayProcess(env: {
  port: number;
  databasePath: string;
  mqttUrl: string;
  clientId: string;
  extra?: Record<string, string>;
}): Promise<{ child: Child; url: string; password: (role: string) => string }> {
  const main = join(ROOT, 'gateway/dist/main.js');
  if (!existsSync(main)) throw new Error('build the gateway first: npm run build -w gateway');
  const child = Child.node('gateway', [main], {
    PORT: String(env.port),
    HOST: '127.0.0.1',
    DATABASE_PATH: env.databasePath,
    MQTT_URL: env.mqttUrl,
    MQTT_CLIENT_ID: env.clientId,
    CONSOLE_DIST: join(env.databasePath, '..', 'no-console'),
    DEMO_MODE: 'true',
    JWT_SECRET: 'fault-test-key-0123456789abcdefghijklmnopqrstuvwxyz',
    PASSWORD_SCRYPT_N: String(2 ** 14),
    SIGN_IN_RATE_PER_MIN: '200',
    BACKFILL_RETRY_MS: '1000',
    BACKFILL_ATTEMPTS: '10',
    ...env.extra,
  });
  const url = `http://127.0.0.1:${env.port}`;
  await waitFor(
    'the gateway to be healthy and connected',
    async () => {
      if (!child.running) throw new Error(`gateway exited:\n${child.output.slice(-4000)}`);
      const res = await fetch(`${url}/api/health`);
      const body = (await res.json()) as { info?: { broker?: { status?: string } } };
      if (body.info?.broker?.status !== 'up') throw new Error(`health ${res.status}`);
    },
    60_000,
    250,
  );
  // demo mode prints this start's passwords once, one account per line
  const password = (role: string) => {
    const lines = child.output.split('\n');
    let start = 0;
    lines.forEach((l, i) => {
      if (l.includes('DEMO MODE: sign-in accounts')) start = i;
    });
    const line = lines.slice(start).find((l) => new RegExp(`^\\s+${role}\\s+\\S+`).test(l));
    const m = line && new RegExp(`^\\s+${role}\\s+(\\S+)`).exec(line);
    if (!m) throw new Error(`no demo password for ${role} in the gateway's output`);
    return m[1]!;
  };
  return { child, url, password };
}

/** Signs in as a demo role and asks the gateway to verify the whole logbook chain now. */
export async function verifyLogbook(
  url: string,
  password: string,
): Promise<{ ok: boolean; count: number; firstBad?: unknown }> {
  const signIn = await fetch(`${url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ username: 'operator', password }),
  });
  if (signIn.status !== 200) throw new Error(`sign-in: ${signIn.status} ${await signIn.text()}`);
  const { accessToken } = (await signIn.json()) as { accessToken: string };
  const res = await fetch(`${url}/api/logbook/verify`, {
    headers: { authorization: `Bearer ${accessToken}` },
  });
  if (res.status !== 200) throw new Error(`verify: ${res.status} ${await res.text()}`);
  return (await res.json()) as { ok: boolean; count: number; firstBad?: unknown };
}

export interface DeviceLedger {
  deviceId: string;
  lastSeq: number;
  lost: number;
  overrunUnsent: number;
}

/** The simulator from its build, on an outside broker, fast, with a stats file to count against. */
export async function startSimulatorProcess(opts: {
  mqttUrl: string;
  speed: number;
  statsFile: string;
}): Promise<{ child: Child; hold(): Promise<DeviceLedger[]> }> {
  const cli = join(ROOT, 'simulator/dist/cli.js');
  if (!existsSync(cli)) throw new Error('build the simulator first: npm run build -w simulator');
  // plant time starts two days back, so a fast plant stays behind the wall clock
  const startTime = new Date(Date.now() - 48 * 3600_000).toISOString();
  const child = Child.node(
    'simulator',
    [
      cli,
      '--no-broker',
      '--mqtt-url',
      opts.mqttUrl,
      '--speed',
      String(opts.speed),
      '--start-time',
      startTime,
      '--stats-file',
      opts.statsFile,
    ],
    {},
  );
  await child.waitForOutput(/devices connected to/, 30_000);
  const hold = async () => {
    child.signal('SIGUSR2');
    return waitFor(
      'the simulator to hold and send all it buffered',
      () => {
        const stats = JSON.parse(readFileSync(opts.statsFile, 'utf8')) as {
          held: boolean;
          idle: boolean;
          devices: DeviceLedger[];
        };
        if (!stats.held || !stats.idle) throw new Error('not held and idle yet');
        return stats.devices;
      },
      60_000,
    );
  };
  return { child, hold };
}

/**
 * A TCP relay in front of the broker that the test can cut: every connection through it is
 * destroyed and new ones are refused until it is mended, as when the network to the broker drops.
 * The broker itself runs on and keeps its sessions.
 */
export class CuttableLink {
  private server?: Server;
  private readonly sockets = new Set<Socket>();

  private constructor(
    readonly port: number,
    private readonly target: number,
  ) {}

  static async open(target: number): Promise<CuttableLink> {
    const link = new CuttableLink(await freePort(), target);
    await link.mend();
    return link;
  }

  get url(): string {
    return `mqtt://127.0.0.1:${this.port}`;
  }

  mend(): Promise<void> {
    this.server = createServer((client) => {
      const upstream = connect(this.target, '127.0.0.1');
      for (const s of [client, upstream]) {
        this.sockets.add(s);
        s.on('close', () => this.sockets.delete(s));
        s.on('error', () => s.destroy());
      }
      client.pipe(upstream).pipe(client);
      client.on('close', () => upstream.destroy());
      upstream.on('close', () => client.destroy());
    });
    return new Promise((resolve) => this.server!.listen(this.port, '127.0.0.1', resolve));
  }

  async cut(): Promise<void> {
    const closed = new Promise<void>((resolve) => this.server?.close(() => resolve()));
    for (const s of this.sockets) s.destroy();
    await closed;
  }
}
