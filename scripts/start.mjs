#!/usr/bin/env node
// `npm start`: the broker and simulated plant, then the gateway serving the console, as one process tree.
// Arguments after `npm start --` go to the simulator (for example `--speed 60`). Ctrl-C stops everything.
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { runTree } from './process-tree.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const brokerPort = process.env.MQTT_PORT ?? '1883';
const env = { ...process.env, MQTT_URL: process.env.MQTT_URL ?? `mqtt://127.0.0.1:${brokerPort}` };

runTree(
  [
    {
      name: 'simulator',
      args: [
        join(root, 'simulator/dist/cli.js'),
        '--broker-port',
        brokerPort,
        ...process.argv.slice(2),
      ],
    },
    { name: 'gateway', args: [join(root, 'gateway/dist/main.js')] },
  ],
  env,
);
