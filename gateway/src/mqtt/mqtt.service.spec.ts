import { ConfigService } from '@nestjs/config';
import { connectAsync } from 'mqtt';
import { startTestBroker, type TestBroker } from '../../test/support/broker';
import { eventually } from '../../test/support/gateway';
import { MqttService } from './mqtt.service';

/**
 * Readiness against a real broker that holds its SUBACKs back: "connected" comes first, and a
 * message published then would be lost to a fresh session, so the service is ready only later.
 */
describe('MqttService readiness', () => {
  let broker: TestBroker;
  let service: MqttService;

  beforeAll(async () => {
    broker = await startTestBroker(0, 1500);
  });

  afterAll(async () => {
    await service?.onModuleDestroy();
    await broker?.stop();
  });

  it('is connected before it is ready, and ready once the broker confirmed the subscriptions', async () => {
    service = new MqttService(
      new ConfigService({ MQTT_URL: broker.url, MQTT_CLIENT_ID: `ready-test-${Date.now()}` }),
    );
    const received: string[] = [];
    service.subscribe('stillwell/v1/+/clock', (_topic, payload) =>
      received.push(payload.toString()),
    );
    service.onModuleInit();
    await eventually(() => expect(service.connected).toBe(true));
    expect(service.ready).toBe(false);
    await eventually(() => expect(service.ready).toBe(true));

    const device = await connectAsync(broker.url, { clientId: `ready-device-${Date.now()}` });
    await device.publishAsync('stillwell/v1/any/clock', 'tick', { qos: 1 });
    await device.endAsync();
    await eventually(() => expect(received).toEqual(['tick']));
  });
});
