import type { SubscribeAck, SubscribeRequest } from '@stillwell/shared/telemetry';
import type { LiveSocket, LiveSocketEvents } from '../lib/live-socket';

type Listeners = { [E in keyof LiveSocketEvents]: Set<LiveSocketEvents[E]> };

/** A live connection driven by the test: it says when it connects and what the server pushes. */
export class FakeLiveSocket implements LiveSocket {
  connected = false;
  active = true;
  readonly subscriptions: { request: SubscribeRequest; ack: (ack: SubscribeAck) => void }[] = [];
  readonly unsubscriptions: SubscribeRequest[] = [];
  readonly forecastSubscriptions: {
    request: SubscribeRequest;
    ack: (ack: SubscribeAck) => void;
  }[] = [];
  readonly ordersSubscriptions: {
    request: SubscribeRequest;
    ack: (ack: SubscribeAck) => void;
  }[] = [];
  readonly alarmsSubscriptions: {
    request: SubscribeRequest;
    ack: (ack: SubscribeAck) => void;
  }[] = [];
  readonly alarmsUnsubscriptions: SubscribeRequest[] = [];
  readonly logbookFollows: Array<(ack: SubscribeAck) => void> = [];
  private readonly listeners: Listeners = {
    connect: new Set(),
    disconnect: new Set(),
    connect_error: new Set(),
    readings: new Set(),
    status: new Set(),
    forecast: new Set(),
    order: new Set(),
    emergency: new Set(),
    automation: new Set(),
    'order-alarm': new Set(),
    'logbook-entry': new Set(),
    'alarm-list': new Set(),
  };

  connect(): void {
    // The test decides when the server answers: see serverConnects.
  }

  disconnect(): void {
    this.connected = false;
  }

  on<E extends keyof LiveSocketEvents>(event: E, listener: LiveSocketEvents[E]): void {
    this.listeners[event].add(listener);
  }

  off<E extends keyof LiveSocketEvents>(event: E, listener: LiveSocketEvents[E]): void {
    this.listeners[event].delete(listener);
  }

  subscribe(request: SubscribeRequest, ack: (ack: SubscribeAck) => void): void {
    this.subscriptions.push({ request, ack });
  }

  unsubscribe(request: SubscribeRequest): void {
    this.unsubscriptions.push(request);
  }

  subscribeForecast(request: SubscribeRequest, ack: (ack: SubscribeAck) => void): void {
    this.forecastSubscriptions.push({ request, ack });
  }

  unsubscribeForecast(request: SubscribeRequest): void {
    this.unsubscriptions.push(request);
  }

  subscribeOrders(request: SubscribeRequest, ack: (ack: SubscribeAck) => void): void {
    this.ordersSubscriptions.push({ request, ack });
  }

  unsubscribeOrders(request: SubscribeRequest): void {
    this.unsubscriptions.push(request);
  }

  subscribeAlarms(request: SubscribeRequest, ack: (ack: SubscribeAck) => void): void {
    this.alarmsSubscriptions.push({ request, ack });
  }

  unsubscribeAlarms(request: SubscribeRequest): void {
    this.alarmsUnsubscriptions.push(request);
  }

  followLogbook(ack: (ack: SubscribeAck) => void): void {
    this.logbookFollows.push(ack);
  }

  unfollowLogbook(): void {}

  serverConnects(): void {
    this.connected = true;
    this.active = true;
    this.listeners.connect.forEach((listener) => listener());
  }

  serverDrops(reason = 'transport close'): void {
    this.connected = false;
    this.listeners.disconnect.forEach((listener) => listener(reason));
  }

  push(
    event: Exclude<keyof LiveSocketEvents, 'connect' | 'disconnect' | 'connect_error'>,
    payload: unknown,
  ): void {
    this.listeners[event].forEach((listener) => listener(payload));
  }

  listenerCount(event: keyof LiveSocketEvents): number {
    return this.listeners[event].size;
  }
}
