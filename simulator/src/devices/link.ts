import { connectAsync, type MqttClient } from 'mqtt';

/** Publishes not yet acknowledged by the broker beyond which a link counts as congested. */
const MAX_PENDING = 2000;
/** How long a closing link waits for outstanding acknowledgements, ms. */
const CLOSE_GRACE_MS = 3000;

/**
 * One device's MQTT connection. Publishes at QoS 1. While the connection is down a message is
 * dropped rather than queued: a real field device has a small buffer, and an unbounded in-memory
 * queue would hide an outage from the gateway (it sees the gap in sequence numbers instead).
 */
export class DeviceLink {
  private pending = 0;
  private waiters: Array<() => void> = [];

  private constructor(private readonly client: MqttClient) {}

  /** `auth`: the device's broker account (a broker with an ACL refuses a device without one). */
  static async connect(
    url: string,
    clientId: string,
    auth?: { username: string; password: string },
  ): Promise<DeviceLink> {
    const client = await connectAsync(url, {
      clientId,
      ...auth,
      clean: true,
      reconnectPeriod: 1000,
      connectTimeout: 10_000,
    });
    return new DeviceLink(client);
  }

  get connected(): boolean {
    return this.client.connected;
  }

  /** The broker is behind. A link that is down is not congested: it drops, and the plant goes on. */
  get congested(): boolean {
    return this.client.connected && this.pending >= MAX_PENDING;
  }

  /** Sends a QoS 1 message; returns false when it was dropped because the link is down. */
  publish(topic: string, payload: string, retain = false): boolean {
    if (!this.client.connected) return false;
    this.pending++;
    this.client.publish(topic, payload, { qos: 1, retain }, () => {
      this.pending--;
      if (this.pending === 0) this.wake();
    });
    return true;
  }

  /** Called on every (re)connect: what waited in the device's buffer can go now. */
  onConnect(listener: () => void): void {
    this.client.on('connect', listener);
  }

  /** Subscribes at QoS 1 (mqtt.js renews the subscription after a reconnect with a clean session). */
  async subscribe(topic: string, onMessage: (payload: string) => void): Promise<void> {
    this.client.on('message', (t, payload) => {
      if (t === topic) onMessage(payload.toString('utf8'));
    });
    await this.client.subscribeAsync(topic, { qos: 1 });
  }

  /** Resolves once every message sent so far has been acknowledged by the broker (or failed). */
  flush(): Promise<void> {
    if (this.pending === 0) return Promise.resolve();
    return new Promise((resolve) => this.waiters.push(resolve));
  }

  /**
   * Waits (briefly) for outstanding acknowledgements, then disconnects. mqtt.js would wait for them
   * forever once the broker is gone, so a link that is down, or still waiting after the grace
   * period, is closed at once.
   */
  async close(): Promise<void> {
    if (this.client.connected) {
      let timer: NodeJS.Timeout | undefined;
      let onClose: (() => void) | undefined;
      const graceful = this.client.endAsync(false);
      const gaveUp = new Promise<'late'>((resolve) => {
        timer = setTimeout(() => resolve('late'), CLOSE_GRACE_MS);
        onClose = () => resolve('late');
        this.client.once('close', onClose);
      });
      const outcome = await Promise.race([graceful, gaveUp]);
      clearTimeout(timer);
      if (onClose) this.client.off('close', onClose);
      if (outcome === 'late') await this.client.endAsync(true);
    } else {
      await this.client.endAsync(true);
    }
    this.wake();
  }

  private wake(): void {
    const waiters = this.waiters;
    this.waiters = [];
    for (const w of waiters) w();
  }
}
