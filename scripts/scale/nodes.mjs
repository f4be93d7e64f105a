// The project's own processes for the scale-out check: built gateways and the simulator, each a
// child whose output is kept (shown when the check fails) and which is stopped by its pid.
import { spawn } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = join(dirname(fileURLToPath(import.meta.url)), '../..');

/** Starts `node args` and resolves once its output matches `ready`; rejects if it exits first. */
export function startNode(name, args, env, ready, timeoutMs = 120_000) {
  const child = spawn(process.execPath, args, {
    cwd: root,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  const node = {
    name,
    child,
    output: () => out,
    stop: (signal = 'SIGTERM') =>
      new Promise((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        const timer = setTimeout(() => child.kill('SIGKILL'), 15_000);
        child.once('exit', () => (clearTimeout(timer), resolve()));
        child.kill(signal);
      }),
  };
  return new Promise((resolve, reject) => {
    const timer = setTimeout(
      () => reject(new Error(`${name} not ready in ${timeoutMs / 1000} s:\n${out.slice(-3000)}`)),
      timeoutMs,
    );
    const onData = (d) => {
      out += d;
      if (!ready.test(out)) return;
      clearTimeout(timer);
      resolve(node);
    };
    child.stdout.on('data', onData);
    child.stderr.on('data', onData);
    child.once('exit', (code, signal) => {
      clearTimeout(timer);
      reject(new Error(`${name} exited (${signal ?? code}):\n${out.slice(-3000)}`));
    });
  });
}

/** One built gateway, configured through its environment only, as in production. */
export function startGateway(name, env) {
  return startNode(name, [join(root, 'gateway/dist/main.js')], env, /Stillwell is on/);
}

/** The simulator's accounts (kind, username, password), as it prints them for another broker. */
export async function simulatorAccounts(env) {
  const sim = spawn(process.execPath, [join(root, 'simulator/dist/cli.js'), '--print-accounts'], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  let out = '';
  sim.stdout.on('data', (d) => (out += d));
  await new Promise((r) => sim.once('exit', r));
  return out
    .trim()
    .split('\n')
    .map((line) => {
      const [kind, username, password] = line.split('\t');
      return { kind, username, password };
    });
}

/** The simulated plant, its devices connected to an outside broker; stats on SIGUSR2. */
export function startSimulator(env, mqttUrl, statsFile, speed) {
  return startNode(
    'simulator',
    [
      join(root, 'simulator/dist/cli.js'),
      '--no-broker',
      '--mqtt-url',
      mqttUrl,
      '--speed',
      String(speed),
      '--stats-file',
      statsFile,
    ],
    env,
    /\[sim [^\]]+\]/,
  );
}
