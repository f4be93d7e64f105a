import { describe, expect, it } from 'vitest';
import { DEMO_CREDENTIALS } from './broker/accounts.js';
import { parseCli } from './cli-options.js';

describe('parseCli', () => {
  it('defaults to a local broker and the demo storm', () => {
    expect(parseCli([], {})).toEqual({
      help: false,
      options: { broker: true, credentials: DEMO_CREDENTIALS, scenario: 'demo-storm', faults: [] },
      printAccounts: false,
      demoCredentials: true,
    });
  });

  it('reads every option', () => {
    const result = parseCli(
      [
        '--speed',
        '3600',
        '--broker-port',
        '0',
        '--scenario',
        'demo-storm',
        '--seed',
        '7',
        '--dropout',
        'pool-radar:20-23',
        '--dropout',
        'inflow-gauge:1-2',
        '--freeze',
        'tailwater-gauge:5-6.5',
        '--mqtt-url',
        'mqtt://127.0.0.1:1999',
        '--no-broker',
      ],
      {},
    );
    expect(result).toEqual({
      help: false,
      printAccounts: false,
      demoCredentials: true,
      options: {
        broker: false,
        credentials: DEMO_CREDENTIALS,
        speed: 3600,
        brokerPort: 0,
        mqttUrl: 'mqtt://127.0.0.1:1999',
        scenario: 'demo-storm',
        seed: 7,
        faults: [
          { kind: 'dropout', deviceId: 'pool-radar', startHour: 20, endHour: 23 },
          { kind: 'dropout', deviceId: 'inflow-gauge', startHour: 1, endHour: 2 },
          { kind: 'freeze', deviceId: 'tailwater-gauge', startHour: 5, endHour: 6.5 },
        ],
      },
    });
  });

  it('reads the start time and the stats file, and names a bad start time', () => {
    const result = parseCli(
      ['--start-time', '2030-01-01T06:00:00Z', '--stats-file', '/tmp/sim-stats.json'],
      {},
    );
    expect(result).toMatchObject({
      statsFile: '/tmp/sim-stats.json',
      options: { startTime: new Date(Date.UTC(2030, 0, 1, 6)) },
    });
    expect(() => parseCli(['--start-time', 'tomorrow'], {})).toThrow(/--start-time "tomorrow"/);
    expect(() => parseCli(['--stats-file', ' '], {})).toThrow(/--stats-file/);
  });

  it('takes the broker accounts from the environment, demo values only for what is unset', () => {
    const env = {
      SIM_GATEWAY_USERNAME: 'gw',
      SIM_GATEWAY_PASSWORD: 'gw-secret',
      SIM_DEVICE_SECRET: 'dev-secret',
    };
    expect(parseCli(['--print-accounts'], env)).toMatchObject({
      printAccounts: true,
      demoCredentials: false,
      options: {
        credentials: {
          gateway: { username: 'gw', password: 'gw-secret' },
          deviceSecret: 'dev-secret',
        },
      },
    });
    expect(parseCli([], { SIM_GATEWAY_PASSWORD: 'gw-secret' })).toMatchObject({
      demoCredentials: true,
    });
  });

  it('takes MQTT_PORT and SIM_SPEED from the environment, the flags winning', () => {
    expect(parseCli([], { MQTT_PORT: '2883', SIM_SPEED: '60' })).toMatchObject({
      options: { brokerPort: 2883, speed: 60 },
    });
    expect(parseCli(['--speed', '10'], { SIM_SPEED: '60' })).toMatchObject({
      options: { speed: 10 },
    });
  });

  it('answers --help', () => {
    expect(parseCli(['--help'], {})).toEqual({ help: true });
  });

  it.each([
    [['--speed', '0']],
    [['--speed', 'fast']],
    [['--broker-port', '70000']],
    [['--seed', '1.5']],
    [['--mqtt-url', 'http://x']],
    [['--dropout', 'pool-radar']],
    [['--loud']],
  ])('refuses %j', (argv) => {
    expect(() => parseCli(argv, {})).toThrow();
  });
});
