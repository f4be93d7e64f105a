import { connectAsync, type MqttClient } from 'mqtt';
import request from 'supertest';
import { ruleEventsTopic, rulesTopic } from '@stillwell/shared/orders';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { ackTopic, commandTopic, telemetryTopic } from '@stillwell/shared/telemetry';
import { SiteClockService } from '../../src/clock/site-clock.service';
import { StatusService } from '../../src/telemetry/status.service';
import { eventually, type TestGateway } from './gateway';

const RES = DEMO_RESERVOIR.id;
const CONTROLLER = 'gate-controller';

export type ControllerMode = 'obey' | 'silent' | 'reject';

export interface Command {
  commandId: string;
  gates?: Record<string, number>;
  valves?: Record<string, number>;
}

const CHANNEL: Record<string, { channel: string; unit: string }> = {
  'gate-1': { channel: 'gate.1.opening', unit: 'm' },
  'gate-2': { channel: 'gate.2.opening', unit: 'm' },
  'gate-3': { channel: 'gate.3.opening', unit: 'm' },
  'low-level-outlet': { channel: 'outlet.valve', unit: '%' },
};

/**
 * The field as the gateway meets it over a real broker, driven step by step by the test: gauges
 * that report when told (at site time), and a gate controller that obeys, stays silent or refuses.
 * Gates move only when the test says so, so that no test depends on timing.
 */
export class TestField {
  mode: ControllerMode = 'obey';
  readonly commands: Command[] = [];
  readonly rules: unknown[] = [];
  readonly positions: Record<string, number> = {
    'gate-1': 0,
    'gate-2': 0,
    'gate-3': 0,
    'low-level-outlet': 10,
  };
  pool = 205;
  inflow = 600;
  private seq = new Map<string, number>();
  private lastT = 0;

  private constructor(
    private readonly gateway: TestGateway,
    readonly client: MqttClient,
  ) {}

  static async start(gateway: TestGateway, brokerUrl: string): Promise<TestField> {
    await eventually(async () => {
      const res = await request(gateway.url).get('/api/health');
      if (res.body.info?.broker?.status !== 'up') throw new Error('broker not up yet');
    });
    const client = await connectAsync(brokerUrl, {
      clientId: `test-field-${Date.now()}`,
      protocolVersion: 4,
    });
    const field = new TestField(gateway, client);
    client.on('message', (topic, payload) => field.onMessage(topic, payload.toString('utf8')));
    await client.subscribeAsync([commandTopic(RES, CONTROLLER), rulesTopic(RES, CONTROLLER)], {
      qos: 1,
    });
    return field;
  }

  get siteNow(): number {
    return this.gateway.app.get(SiteClockService).now(RES);
  }

  /** Moves the site clock forward (as the simulator's clock message would), never back. */
  advanceSiteClock(ms: number): void {
    const clock = this.gateway.app.get(SiteClockService);
    const message = { siteTime: new Date(clock.now(RES) + ms).toISOString(), speed: 1 };
    clock.accept(`stillwell/v1/${RES}/clock`, Buffer.from(JSON.stringify(message)));
  }

  /** Every gauge and position reports now; resolves when the gateway's status shows them. */
  async report(only?: string[]): Promise<void> {
    // strictly increasing times, so each report is newer than the last
    const t = Math.max(this.siteNow, this.lastT + 1);
    this.lastT = t;
    const sends: Array<[string, string, number, string]> = [
      ['pool-radar', 'pool.radar', this.pool, 'm'],
      ['pool-pressure', 'pool.pressure', this.pool, 'm'],
      ['inflow-gauge', 'inflow', this.inflow, 'm3/s'],
    ];
    for (const [id, v] of Object.entries(this.positions)) {
      if (only && !only.includes(id)) continue;
      sends.push([CONTROLLER, CHANNEL[id]!.channel, v, CHANNEL[id]!.unit]);
    }
    for (const [deviceId, channel, value, unit] of sends) {
      const seq = this.seq.get(deviceId) ?? 0;
      this.seq.set(deviceId, seq + 1);
      const message = {
        deviceId,
        channel,
        seq,
        time: new Date(t).toISOString(),
        value,
        unit,
        quality: 'good',
      };
      await this.client.publishAsync(telemetryTopic(RES, deviceId), JSON.stringify(message), {
        qos: 1,
      });
    }
    const status = this.gateway.app.get(StatusService);
    await eventually(() => {
      const s = status.status(RES);
      for (const [, channel] of sends.map((x) => [x[0], x[1]] as const)) {
        const c = s.channels.find((x) => x.channel === channel);
        if (!c || c.t !== t) throw new Error(`${channel} not stored yet`);
      }
    });
  }

  /** Moves a gate to its last commanded target (or a given opening) and reports it. */
  async move(control: string, to: number): Promise<void> {
    this.positions[control] = to;
    await this.report();
  }

  lastCommand(): Command {
    const c = this.commands.at(-1);
    if (!c) throw new Error('no command received');
    return c;
  }

  async ruleEvent(event: Record<string, unknown>): Promise<void> {
    await this.client.publishAsync(ruleEventsTopic(RES, CONTROLLER), JSON.stringify(event), {
      qos: 1,
    });
  }

  async stop(): Promise<void> {
    // leave no retained rule set behind on the broker
    await this.client.publishAsync(rulesTopic(RES, CONTROLLER), '', { qos: 1, retain: true });
    await this.client.endAsync(true);
  }

  private onMessage(topic: string, payload: string): void {
    if (topic === rulesTopic(RES, CONTROLLER)) {
      if (payload) this.rules.push(JSON.parse(payload));
      return;
    }
    const command = JSON.parse(payload) as Command;
    this.commands.push(command);
    if (this.mode === 'silent') return;
    const ack =
      this.mode === 'obey'
        ? {
            commandId: command.commandId,
            status: 'accepted',
            time: new Date(this.siteNow).toISOString(),
          }
        : {
            commandId: command.commandId,
            status: 'rejected',
            reason: 'gate 2 hydraulic pressure low',
            time: new Date(this.siteNow).toISOString(),
          };
    void this.client.publishAsync(ackTopic(RES, CONTROLLER), JSON.stringify(ack), { qos: 1 });
  }
}
