#!/usr/bin/env node
// `npm start`: the broker and simulated plant, then the gateway serving the console, as one process tree.
// Arguments after `npm start --` go to the simulator (for example `--speed 60`). Ctrl-C stops everything.
import { randomBytes } from 'node:crypto';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { runTree } from './process-tree.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const brokerPort = process.env.MQTT_PORT ?? '1883';
// The bundled broker admits only known accounts: a fresh random gateway password and device
// secret for every start, given to the simulator (its broker and devices) and to the gateway.
const gatewayUser = process.env.MQTT_USERNAME ?? 'stillwell-gateway';
const gatewayPassword = process.env.MQTT_PASSWORD ?? randomBytes(18).toString('base64url');
const env = {
  ...process.env,
  MQTT_URL: process.env.MQTT_URL ?? `mqtt://127.0.0.1:${brokerPort}`,
  MQTT_USERNAME: gatewayUser,
  MQTT_PASSWORD: gatewayPassword,
  SIM_GATEWAY_USERNAME: gatewayUser,
  SIM_GATEWAY_PASSWORD: gatewayPassword,
  SIM_DEVICE_SECRET: process.env.SIM_DEVICE_SECRET ?? randomBytes(18).toString('base64url'),
};

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
