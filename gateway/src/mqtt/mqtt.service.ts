import { Injectable, Logger, OnModuleDestroy, OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { connect, type MqttClient } from 'mqtt';
import type { Env } from '../config';
import { subscriptionFilter } from './shared-subscription';
import { topicMatches } from './topic-filter';

export type MqttHandler = (topic: string, payload: Buffer) => void;

/**
 * The gateway's one connection to the broker. Standard MQTT 3.1.1, so any broker will do; with
 * MQTT_SHARED_GROUP set, MQTT 5 and shared subscriptions so that several gateways split the
 * readings (the bundled aedes speaks 3.1.1 only: leave the group unset with it).
 * A persistent session (clean off) and QoS 1 keep messages queued at the broker while we are away;
 * subscriptions are renewed on every connect because a broker that lost the session won't keep them.
 */
@Injectable()
export class MqttService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger(MqttService.name);
  private client?: MqttClient;
  private readonly handlers: Array<{ filter: string; handler: MqttHandler }> = [];
  private readonly group: string | undefined;
  /** Subscribe requests sent and not yet answered by the broker (SUBACK). */
  private unanswered = 0;
  /** Whether the broker has acknowledged this connection's subscriptions. */
  private acknowledged = false;
  /** Counts connections, so an answer meant for an earlier one is not taken for this one's. */
  private connection = 0;

  /** Set when several gateways share the ingestion: each then sees only its share of a device's seqs. */
  get sharedGroup(): string | undefined {
    return this.group;
  }

  constructor(private readonly config: ConfigService<Env, true>) {
    this.group = config.get('MQTT_SHARED_GROUP', { infer: true });
  }

  onModuleInit(): void {
    const url = this.config.get('MQTT_URL', { infer: true });
    this.client = connect(url, {
      clientId: this.config.get('MQTT_CLIENT_ID', { infer: true }),
      username: this.config.get('MQTT_USERNAME', { infer: true }),
      password: this.config.get('MQTT_PASSWORD', { infer: true }),
      ...(this.group
        ? // MQTT 5 ends a session at disconnect unless told otherwise: keep it a day
          { protocolVersion: 5 as const, properties: { sessionExpiryInterval: 86_400 } }
        : { protocolVersion: 4 as const }),
      clean: false,
      reconnectPeriod: 1000,
      connectTimeout: 5000,
    });
    this.client.on('connect', () => {
      this.logger.log(`Connected to ${url}`);
      this.connection += 1;
      this.unanswered = 0;
      this.acknowledged = false;
      this.resubscribe();
    });
    this.client.on('error', (error) => this.logger.warn(`MQTT: ${error.message}`));
    this.client.on('offline', () => this.logger.warn(`Broker ${url} unreachable; retrying`));
    this.client.on('message', (topic, payload) => this.dispatch(topic, payload));
  }

  async onModuleDestroy(): Promise<void> {
    await this.client?.endAsync();
  }

  get connected(): boolean {
    return this.client?.connected ?? false;
  }

  /**
   * Connected, and the broker has answered every subscription: from here on a message published
   * to a subscribed topic reaches us (before the SUBACK, a fresh session would not queue it).
   */
  get ready(): boolean {
    return this.connected && this.acknowledged && this.unanswered === 0;
  }

  /** Registers a handler; the subscription is made now if connected and again on every reconnect. */
  subscribe(filter: string, handler: MqttHandler): void {
    this.handlers.push({ filter, handler });
    if (this.client?.connected) this.send([subscriptionFilter(filter, this.group)]);
  }

  async publish(topic: string, payload: string, retain = false): Promise<void> {
    if (!this.client) throw new Error('MQTT client not started');
    await this.client.publishAsync(topic, payload, { qos: 1, retain });
  }

  private resubscribe(): void {
    const filters = [
      ...new Set(this.handlers.map((h) => subscriptionFilter(h.filter, this.group))),
    ];
    if (filters.length) this.send(filters);
    else this.acknowledged = true;
  }

  private send(filters: string[]): void {
    const connection = this.connection;
    this.unanswered += 1;
    this.client?.subscribe(filters, { qos: 1 }, (error) => {
      if (connection !== this.connection) return;
      this.unanswered -= 1;
      if (error) this.logger.warn(`Subscribing to ${filters.join(', ')} failed: ${error.message}`);
      else this.acknowledged = true;
    });
  }

  private dispatch(topic: string, payload: Buffer): void {
    for (const { filter, handler } of this.handlers) {
      if (!topicMatches(filter, topic)) continue;
      try {
        handler(topic, payload);
      } catch (error) {
        // A handler must never take the connection down; it is a bug to fix, so say it loudly.
        this.logger.error(`Handler for ${filter} failed on ${topic}: ${(error as Error).stack}`);
      }
    }
  }
}
