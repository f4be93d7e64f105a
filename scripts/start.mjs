#!/usr/bin/env node
// `npm start`: the broker and simulated plant, then the gateway serving the console, as one process tree.
// Arguments after `npm start --` go to the simulator (for example `--speed 60`). Ctrl-C stops everything.
import { spawn } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const brokerPort = process.env.MQTT_PORT ?? '1883';
const env = {
  ...process.env,
  MQTT_URL: process.env.MQTT_URL ?? `mqtt://127.0.0.1:${brokerPort}`,
};

const children = [];
let stopping = false;

function run(name, script, args) {
  const child = spawn(process.execPath, [join(root, script), ...args], { env, stdio: 'inherit' });
  child.on('exit', (code, signal) => {
    if (stopping) return;
    console.error(`[stillwell] ${name} stopped (${signal ?? `exit ${code}`}); stopping the rest.`);
    stop(code ?? 1);
  });
  children.push(child);
  return child;
}

function stop(code = 0) {
  if (stopping) return;
  stopping = true;
  let left = children.filter((c) => c.exitCode === null && c.signalCode === null);
  if (!left.length) process.exit(code);
  const timer = setTimeout(() => left.forEach((c) => c.kill('SIGKILL')), 10_000);
  for (const c of left) {
    c.once('exit', () => {
      left = left.filter((x) => x !== c);
      if (!left.length) {
        clearTimeout(timer);
        process.exit(code);
      }
    });
    c.kill('SIGTERM');
  }
}

process.on('SIGINT', () => stop(0));
process.on('SIGTERM', () => stop(0));

run('simulator', 'simulator/dist/cli.js', ['--broker-port', brokerPort, ...process.argv.slice(2)]);
run('gateway', 'gateway/dist/main.js', []);
