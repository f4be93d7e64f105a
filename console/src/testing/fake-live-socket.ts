import type { SubscribeAck, SubscribeRequest } from '@stillwell/shared/telemetry';
import type { LiveSocket, LiveSocketEvents } from '../lib/live-socket';

type Listeners = { [E in keyof LiveSocketEvents]: Set<LiveSocketEvents[E]> };

/** A live connection driven by the test: it says when it connects and what the server pushes. */
export class FakeLiveSocket implements LiveSocket {
  connected = false;
  active = true;
  readonly subscriptions: { request: SubscribeRequest; ack: (ack: SubscribeAck) => void }[] = [];
  readonly unsubscriptions: SubscribeRequest[] = [];
  private readonly listeners: Listeners = {
    connect: new Set(),
    disconnect: new Set(),
    connect_error: new Set(),
    readings: new Set(),
    status: new Set(),
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

  serverConnects(): void {
    this.connected = true;
    this.active = true;
    this.listeners.connect.forEach((listener) => listener());
  }

  serverDrops(reason = 'transport close'): void {
    this.connected = false;
    this.listeners.disconnect.forEach((listener) => listener(reason));
  }

  push(event: 'readings' | 'status', payload: unknown): void {
    this.listeners[event].forEach((listener) => listener(payload));
  }

  listenerCount(event: keyof LiveSocketEvents): number {
    return this.listeners[event].size;
  }
}
