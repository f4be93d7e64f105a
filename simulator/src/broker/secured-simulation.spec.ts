import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { commandTopic, telemetryTopic } from '@stillwell/shared/telemetry';
import { connectAsync, type MqttClient } from 'mqtt';
import { afterEach, describe, expect, it } from 'vitest';
import { startSimulation, type Simulation } from '../simulation.js';
import type { SimulatorCredentials } from './accounts.js';

const CREDS: SimulatorCredentials = {
  gateway: { username: 'stillwell-gateway', password: 'sim-test-gateway' },
  deviceSecret: 'sim-test-devices',
};
const RES = DEMO_RESERVOIR.id;

const running: Array<Simulation | MqttClient> = [];
afterEach(async () => {
  for (const r of running.splice(0).reverse())
    await ('endAsync' in r ? r.endAsync(true) : r.stop());
});

describe('the simulation with broker accounts', () => {
  it('runs every device on its own account, and the gateway account sees telemetry and commands the gates', async () => {
    const log: string[] = [];
    const sim = await startSimulation({
      brokerPort: 0,
      realtime: false,
      credentials: CREDS,
      startTime: new Date(Date.UTC(2030, 0, 1, 6)),
      log: (l) => log.push(l),
    });
    running.push(sim);
    await expect(connectAsync(sim.mqttUrl, { reconnectPeriod: 0 })).rejects.toThrow();

    const gw = await connectAsync(sim.mqttUrl, {
      reconnectPeriod: 0,
      clientId: 'gw-test',
      ...CREDS.gateway,
    });
    running.push(gw);
    const topics = new Set<string>();
    let acked = false;
    const arrived = new Promise<void>((resolve) =>
      gw.on('message', (topic) => {
        topics.add(topic);
        if (topic.includes('/ack/')) acked = true;
        if (acked && topics.has(telemetryTopic(RES, 'pool-radar'))) resolve();
      }),
    );
    await gw.subscribeAsync(['stillwell/v1/+/telemetry/+', 'stillwell/v1/+/ack/+'], { qos: 1 });
    await gw.publishAsync(
      commandTopic(RES, 'gate-controller'),
      JSON.stringify({ commandId: 'c-1', gates: { 'gate-1': 1 } }),
      { qos: 1 },
    );
    sim.advance(120);
    await arrived;
    expect(log.some((l) => l.startsWith('broker: refused'))).toBe(true); // the anonymous try
    expect(log.filter((l) => l.includes('refused publish'))).toEqual([]);
    expect(log).not.toContain(
      'broker is open: no credentials given (any client may publish anything)',
    );
  });
});
