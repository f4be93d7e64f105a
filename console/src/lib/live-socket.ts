import { io, type Socket } from 'socket.io-client';
import {
  LIVE_EVENTS,
  LIVE_NAMESPACE,
  type SubscribeAck,
  type SubscribeRequest,
} from '@stillwell/shared/telemetry';
import { env } from '../config/env';

/** What the console listens to. Payloads are unknown until checked against the shared schemas. */
export interface LiveSocketEvents {
  connect: () => void;
  disconnect: (reason: string) => void;
  connect_error: (error: Error) => void;
  readings: (payload: unknown) => void;
  status: (payload: unknown) => void;
}

/**
 * The narrow face of the live connection that the rest of the console uses. Tests pass a fake of
 * it; the browser gets createLiveSocket's socket.io adapter.
 */
export interface LiveSocket {
  readonly connected: boolean;
  /** true while socket.io will keep trying to (re)connect by itself */
  readonly active: boolean;
  connect(): void;
  disconnect(): void;
  on<E extends keyof LiveSocketEvents>(event: E, listener: LiveSocketEvents[E]): void;
  off<E extends keyof LiveSocketEvents>(event: E, listener: LiveSocketEvents[E]): void;
  subscribe(request: SubscribeRequest, onAck: (ack: SubscribeAck) => void): void;
  unsubscribe(request: SubscribeRequest): void;
}

interface ServerToClient {
  [LIVE_EVENTS.readings]: (payload: unknown) => void;
  [LIVE_EVENTS.status]: (payload: unknown) => void;
}

interface ClientToServer {
  [LIVE_EVENTS.subscribe]: (request: SubscribeRequest, ack: (ack: SubscribeAck) => void) => void;
  [LIVE_EVENTS.unsubscribe]: (request: SubscribeRequest) => void;
}

type Listener = (...args: never[]) => void;

/** The one place a live connection is made, so sign-in (a later issue) adds its token here. */
export function createLiveSocket(): LiveSocket {
  const socket: Socket<ServerToClient, ClientToServer> = io(
    `${env.gatewayOrigin}${LIVE_NAMESPACE}`,
    {
      path: '/socket.io',
      autoConnect: false,
      // The token will travel as `auth: { token }` in these options.
    },
  );
  // socket.io's overloads do not line up with a generic event map, hence the cast to its own type.
  const raw = socket as unknown as {
    on(event: string, listener: Listener): void;
    off(event: string, listener: Listener): void;
  };
  return {
    get connected() {
      return socket.connected;
    },
    get active() {
      return socket.active;
    },
    connect: () => void socket.connect(),
    disconnect: () => void socket.disconnect(),
    on: (event, listener) => raw.on(event, listener),
    off: (event, listener) => raw.off(event, listener),
    subscribe: (request, onAck) => void socket.emit(LIVE_EVENTS.subscribe, request, onAck),
    unsubscribe: (request) => void socket.emit(LIVE_EVENTS.unsubscribe, request),
  };
}
