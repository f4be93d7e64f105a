import { parseArgs } from 'node:util';
import { credentialsFromEnv } from './broker/accounts.js';
import { parseFault } from './scenarios/faults.js';
import { parseLeak } from './scenarios/leak.js';
import type { SimulationOptions } from './simulation.js';

export const USAGE = `stillwell-sim: local MQTT broker and the simulated Orrin Gap plant

Usage: node dist/cli.js [options]

  --speed N                plant seconds per wall second (default 360; env SIM_SPEED)
  --broker-port N          port of the broker started here (default 1883, 0 = any free; env MQTT_PORT)
  --no-broker              start no broker; connect the devices to --mqtt-url
  --mqtt-url URL           broker the devices use (default mqtt://127.0.0.1:1883); without
                           --no-broker the broker started here listens on its port
  --scenario ID            scenario to run (default demo-storm)
  --dropout DEV:H1-H2      device DEV's messages are lost from hour H1 to H2 (repeatable)
  --freeze DEV:H1-H2       device DEV repeats its last value from hour H1 to H2 (repeatable)
  --seed N                 seed of the instrument noise (default 1)
  --leak SIDE:H[:Q]        a hidden leak at the left or right abutment from hour H, growing to
                           Q m3/s (default 8): seepage rises and water goes missing unmeasured
  --start-time ISO         plant time at the start (default: now, to the minute); a time in the past
                           keeps a fast plant's readings behind the wall clock
  --stats-file PATH        on SIGUSR2 the plant stops where it stands, the devices send what they
                           hold and keep answering backfill requests, and what each produced is
                           written here as JSON (again at exit)
  --print-accounts         print the broker accounts (for another broker's password file) and exit
  --help                   show this text

Broker accounts (the broker started here admits only these, each to its own topics):
  SIM_GATEWAY_USERNAME, SIM_GATEWAY_PASSWORD   the gateway's account (its MQTT_USERNAME/PASSWORD)
  SIM_DEVICE_SECRET                            each device's password is derived from it
  Unset: fixed demo values (loopback only); npm start passes random ones.
`;

export type CliResult =
  | { help: true }
  | {
      help: false;
      options: SimulationOptions;
      printAccounts: boolean;
      demoCredentials: boolean;
      statsFile?: string;
    };

function number(name: string, text: string, check: (n: number) => boolean): number {
  const n = Number(text);
  if (text.trim() === '' || !Number.isFinite(n) || !check(n)) {
    throw new RangeError(`--${name} "${text}" is not valid`);
  }
  return n;
}

const isPort = (n: number) => Number.isInteger(n) && n >= 0 && n <= 65535;

/** Reads the command line and environment; throws a RangeError with a message for the user. */
export function parseCli(argv: readonly string[], env: NodeJS.ProcessEnv): CliResult {
  const { values } = parseArgs({
    args: [...argv],
    strict: true,
    allowPositionals: false,
    options: {
      speed: { type: 'string' },
      'broker-port': { type: 'string' },
      'no-broker': { type: 'boolean' },
      'mqtt-url': { type: 'string' },
      scenario: { type: 'string' },
      dropout: { type: 'string', multiple: true },
      freeze: { type: 'string', multiple: true },
      seed: { type: 'string' },
      leak: { type: 'string' },
      'start-time': { type: 'string' },
      'stats-file': { type: 'string' },
      'print-accounts': { type: 'boolean' },
      help: { type: 'boolean' },
    },
  });
  if (values.help) return { help: true };

  const speedText = values.speed ?? env.SIM_SPEED;
  const portText = values['broker-port'] ?? env.MQTT_PORT;
  const mqttUrl = values['mqtt-url'];
  if (mqttUrl !== undefined) {
    let url: URL;
    try {
      url = new URL(mqttUrl);
    } catch {
      throw new RangeError(`--mqtt-url "${mqttUrl}" is not a URL`);
    }
    if (!['mqtt:', 'mqtts:', 'tcp:'].includes(url.protocol)) {
      throw new RangeError(`--mqtt-url "${mqttUrl}": expected mqtt://host:port`);
    }
  }
  const { credentials, demo } = credentialsFromEnv(env);
  const options: SimulationOptions = {
    broker: !values['no-broker'],
    credentials,
    scenario: values.scenario ?? 'demo-storm',
    faults: [
      ...(values.dropout ?? []).map((t) => parseFault('dropout', t)),
      ...(values.freeze ?? []).map((t) => parseFault('freeze', t)),
    ],
  };
  if (speedText !== undefined) {
    options.speed = number('speed', speedText, (n) => n > 0 && n <= 100_000);
  }
  if (portText !== undefined) options.brokerPort = number('broker-port', portText, isPort);
  if (mqttUrl !== undefined) options.mqttUrl = mqttUrl;
  if (values.leak !== undefined) options.leak = parseLeak(values.leak);
  const startText = values['start-time'];
  if (startText !== undefined) {
    const ms = Date.parse(startText);
    if (!/^\d{4}-\d{2}-\d{2}T/.test(startText) || !Number.isFinite(ms)) {
      throw new RangeError(`--start-time "${startText}" is not an ISO 8601 time`);
    }
    options.startTime = new Date(ms);
  }
  const statsFile = values['stats-file'];
  if (statsFile !== undefined && statsFile.trim() === '') {
    throw new RangeError('--stats-file: a path is needed');
  }
  if (values.seed !== undefined) {
    options.seed = number('seed', values.seed, (n) => Number.isInteger(n) && n >= 0);
  }
  return {
    help: false,
    options,
    printAccounts: values['print-accounts'] ?? false,
    demoCredentials: demo,
    ...(statsFile !== undefined ? { statsFile } : {}),
  };
}
