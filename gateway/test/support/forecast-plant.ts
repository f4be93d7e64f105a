import { connectAsync, type MqttClient } from 'mqtt';
import request from 'supertest';
import { telemetryTopic } from '@stillwell/shared/telemetry';
import { SiteClockService } from '../../src/clock/site-clock.service';
import { ForecastScheduler } from '../../src/forecasts/forecast-scheduler.service';
import { ACCESS_TEST_ENV, signInAs, type SignedInUser } from './auth';
import { startTestBroker, type TestBroker } from './broker';
import { eventually, startTestGateway, type TestGateway } from './gateway';

export const RES = 'lake-orrin';
/** The site's "now" at the start of a test: a fixed plant time, never the wall clock. */
export const T0 = Date.parse('2026-12-02T06:00:00.000Z');

/**
 * A real broker and gateway with the forecast's timers off (tests call the scheduled handlers),
 * a site clock the test sets, and a device that publishes the plant's readings over MQTT.
 */
export interface ForecastPlant {
  broker: TestBroker;
  gateway: TestGateway;
  device: MqttClient;
  scheduler: ForecastScheduler;
  operator: SignedInUser;
  /** an agent carrying the operator's token */
  api: ReturnType<typeof request.agent>;
  setSiteClock(ms: number): void;
  publish(
    deviceId: string,
    channel: string,
    unit: string,
    value: number,
    timeMs: number,
  ): Promise<void>;
  close(): Promise<void>;
}

export async function startForecastPlant(env: Record<string, string> = {}): Promise<ForecastPlant> {
  const broker = await startTestBroker();
  const gateway = await startTestGateway({
    ...ACCESS_TEST_ENV,
    MQTT_URL: broker.url,
    FORECAST_TICK_MS: '0',
    // a debounce longer than any test: the test runs the debounced handler itself
    FORECAST_DEBOUNCE_MS: '600000',
    FORECAST_MEMBERS: '40',
    ...env,
  });
  const clock = gateway.app.get(SiteClockService);
  // nearly stopped: the test moves site time in steps of its own
  const setSiteClock = (ms: number) =>
    clock.accept(
      `stillwell/v1/${RES}/clock`,
      Buffer.from(JSON.stringify({ siteTime: new Date(ms).toISOString(), speed: 0.001 })),
    );
  setSiteClock(T0);
  await eventually(async () => {
    const res = await request(gateway.url).get('/api/health');
    expect(res.body.info?.broker?.status).toBe('up');
  });
  const operator = await signInAs(gateway, 'operator');
  const api = request.agent(gateway.url).set('Authorization', `Bearer ${operator.token}`);
  const device = await connectAsync(broker.url, {
    clientId: `plant-${Date.now()}`,
    protocolVersion: 4,
  });
  const seqs = new Map<string, number>();
  const publish = async (
    deviceId: string,
    channel: string,
    unit: string,
    value: number,
    timeMs: number,
  ) => {
    const seq = seqs.get(deviceId) ?? 0;
    seqs.set(deviceId, seq + 1);
    await device.publishAsync(
      telemetryTopic(RES, deviceId),
      JSON.stringify({
        deviceId,
        channel,
        seq,
        time: new Date(timeMs).toISOString(),
        value,
        unit,
        quality: 'good',
      }),
      { qos: 1 },
    );
  };
  return {
    broker,
    gateway,
    device,
    scheduler: gateway.app.get(ForecastScheduler),
    operator,
    api,
    setSiteClock,
    publish,
    close: async () => {
      await device.endAsync();
      await gateway.close();
      await broker.stop();
    },
  };
}

/**
 * A rising flood: three hours of inflow readings climbing from 300 to 900 m3/s, the pool at 206 m,
 * every gate shut and the outlet valve at 10 %. Resolves when the gateway has stored them all.
 */
export async function publishRisingFlood(plant: ForecastPlant, now = T0): Promise<void> {
  const { publish } = plant;
  for (let i = 0; i <= 180; i++)
    await publish(
      'inflow-gauge',
      'inflow',
      'm3/s',
      300 + (600 * i) / 180,
      now - (180 - i) * 60_000,
    );
  for (const [i, v] of [205.98, 205.99, 206].entries())
    await publish('pool-radar', 'pool.radar', 'm', v, now - (2 - i) * 30_000);
  for (const g of [1, 2, 3])
    await publish('gate-controller', `gate.${g}.opening`, 'm', 0, now - 30_000);
  await publish('gate-controller', 'outlet.valve', '%', 10, now - 30_000);
  await eventually(async () => {
    const status = await plant.api.get(`/api/reservoirs/${RES}/status`).expect(200);
    expect(status.body.pool?.elevation).toBe(206);
    expect(status.body.inflow).toBe(900);
    const valve = (status.body.channels as { channel: string }[]).find(
      (c) => c.channel === 'outlet.valve',
    );
    expect(valve).toBeDefined();
  });
}
