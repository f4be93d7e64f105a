import { connectAsync } from 'mqtt';
import { createServer } from 'node:net';
import { describe, expect, it } from 'vitest';
import { startBroker } from './broker.js';

const url = (port: number) => `mqtt://127.0.0.1:${port}`;

describe('startBroker', () => {
  it('listens on a free loopback port, carries messages, and releases the port on close', async () => {
    const broker = await startBroker({ port: 0 });
    expect(broker.host).toBe('127.0.0.1');
    expect(broker.port).toBeGreaterThan(0);
    const client = await connectAsync(url(broker.port), { reconnectPeriod: 0 });
    await client.subscribeAsync('t/1', { qos: 1 });
    const received = new Promise<string>((resolve) =>
      client.on('message', (_t, p) => resolve(p.toString())),
    );
    await client.publishAsync('t/1', 'hello', { qos: 1 });
    expect(await received).toBe('hello');

    const closed = new Promise<void>((resolve) => client.on('close', () => resolve()));
    await broker.close();
    await closed;
    await client.endAsync(true);
    // The port is free again: something else can listen on it.
    const probe = createServer();
    await new Promise<void>((resolve, reject) => {
      probe.once('error', reject);
      probe.listen(broker.port, '127.0.0.1', () => resolve());
    });
    await new Promise<void>((resolve) => probe.close(() => resolve()));
  });

  it('takes pluggable authentication and subscription rules', async () => {
    const broker = await startBroker({
      port: 0,
      policy: {
        authenticate: (_client, username, _password, done) => done(null, username === 'gateway'),
        authorizeSubscribe: (_client, sub, done) =>
          // a null subscription is refused with a failure code; an error would drop the client
          done(null, sub.topic.startsWith('secret/') ? null : sub),
      },
    });
    try {
      await expect(
        connectAsync(url(broker.port), { reconnectPeriod: 0, username: 'nobody' }),
      ).rejects.toThrow();
      const client = await connectAsync(url(broker.port), {
        reconnectPeriod: 0,
        username: 'gateway',
      });
      // mqtt.js turns the refusal (granted QoS 128) into an error; the connection stays up.
      await expect(client.subscribeAsync('secret/x', { qos: 1 })).rejects.toThrow(
        /Subscribe error/,
      );
      const [granted] = await client.subscribeAsync('open/x', { qos: 1 });
      expect(granted?.qos).toBe(1);
      await client.endAsync();
    } finally {
      await broker.close();
    }
  });

  it('reports a port already in use', async () => {
    const first = await startBroker({ port: 0 });
    try {
      await expect(startBroker({ port: first.port })).rejects.toThrow(/EADDRINUSE/);
    } finally {
      await first.close();
    }
  });
});
