import { spawn, type ChildProcess } from 'node:child_process';
import { createInterface } from 'node:readline';

/**
 * A real aedes broker on a free loopback port, in its own process (aedes is ESM-only, and a separate
 * process is also what the gateway meets in production: any MQTT 3.1.1 broker).
 */
const SCRIPT = `
import net from 'node:net';
import { Aedes } from 'aedes';
const delay = Number(process.env.SUBSCRIBE_DELAY_MS ?? 0);
// a slow broker, for tests of what the gateway does before its subscriptions are confirmed
const broker = await Aedes.createBroker(
  delay ? { authorizeSubscribe: (client, sub, done) => setTimeout(() => done(null, sub), delay) } : {},
);
const server = net.createServer(broker.handle);
server.listen(Number(process.env.BROKER_PORT ?? 0), '127.0.0.1', () => console.log('PORT ' + server.address().port));
process.on('SIGTERM', () => { server.close(); broker.close(() => process.exit(0)); });
`;

export interface TestBroker {
  port: number;
  url: string;
  stop(): Promise<void>;
}

/** `subscribeDelayMs` holds every SUBACK back that long. */
export async function startTestBroker(port = 0, subscribeDelayMs = 0): Promise<TestBroker> {
  const child: ChildProcess = spawn(process.execPath, ['--input-type=module', '-e', SCRIPT], {
    cwd: __dirname,
    env: {
      ...process.env,
      BROKER_PORT: String(port),
      SUBSCRIBE_DELAY_MS: String(subscribeDelayMs),
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const actual = await new Promise<number>((resolve, reject) => {
    const lines = createInterface({ input: child.stdout! });
    lines.on('line', (line) => {
      const m = /^PORT (\d+)$/.exec(line);
      if (m) resolve(Number(m[1]));
    });
    child.once('exit', (code) => reject(new Error(`broker exited with ${code}`)));
  });
  return {
    port: actual,
    url: `mqtt://127.0.0.1:${actual}`,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
}
