import { io, type Socket } from 'socket.io-client';
import { ALARM_LIVE_EVENTS } from '@stillwell/shared/alarms';
import { FORECAST_LIVE_EVENTS } from '@stillwell/shared/forecasts';
import { LOGBOOK_LIVE_EVENTS } from '@stillwell/shared/logbook';
import { ORDER_LIVE_EVENTS } from '@stillwell/shared/orders';
import {
  LIVE_EVENTS,
  LIVE_NAMESPACE,
  type SubscribeAck,
  type SubscribeRequest,
} from '@stillwell/shared/telemetry';
import { env } from '../config/env';
import { session } from './auth-session';

/** What the console listens to. Payloads are unknown until checked against the shared schemas. */
export interface LiveSocketEvents {
  connect: () => void;
  disconnect: (reason: string) => void;
  connect_error: (error: Error) => void;
  readings: (payload: unknown) => void;
  status: (payload: unknown) => void;
  forecast: (payload: unknown) => void;
  order: (payload: unknown) => void;
  emergency: (payload: unknown) => void;
  automation: (payload: unknown) => void;
  'order-alarm': (payload: unknown) => void;
  'logbook-entry': (payload: unknown) => void;
  'alarm-list': (payload: unknown) => void;
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
  /** the forecast room: same request and ack, its own permission (forecast.read) */
  subscribeForecast(request: SubscribeRequest, onAck: (ack: SubscribeAck) => void): void;
  unsubscribeForecast(request: SubscribeRequest): void;
  /** the orders room (orders, emergency, automatic rules, order alarms): orders.read */
  subscribeOrders(request: SubscribeRequest, onAck: (ack: SubscribeAck) => void): void;
  unsubscribeOrders(request: SubscribeRequest): void;
  /** the alarms room (the whole alarm list at once, then on every change): alarms.read */
  subscribeAlarms(request: SubscribeRequest, onAck: (ack: SubscribeAck) => void): void;
  unsubscribeAlarms(request: SubscribeRequest): void;
  /** the logbook room (new entries after their commit): logbook.read */
  followLogbook(onAck: (ack: SubscribeAck) => void): void;
  unfollowLogbook(): void;
}

interface ServerToClient {
  [LIVE_EVENTS.readings]: (payload: unknown) => void;
  [LIVE_EVENTS.status]: (payload: unknown) => void;
  [FORECAST_LIVE_EVENTS.forecast]: (payload: unknown) => void;
  [ORDER_LIVE_EVENTS.order]: (payload: unknown) => void;
  [ORDER_LIVE_EVENTS.emergency]: (payload: unknown) => void;
  [ORDER_LIVE_EVENTS.automation]: (payload: unknown) => void;
  [ORDER_LIVE_EVENTS.alarm]: (payload: unknown) => void;
  [LOGBOOK_LIVE_EVENTS.entry]: (payload: unknown) => void;
  [ALARM_LIVE_EVENTS.list]: (payload: unknown) => void;
}

interface ClientToServer {
  [LIVE_EVENTS.subscribe]: (request: SubscribeRequest, ack: (ack: SubscribeAck) => void) => void;
  [LIVE_EVENTS.unsubscribe]: (request: SubscribeRequest) => void;
  [FORECAST_LIVE_EVENTS.subscribe]: (
    request: SubscribeRequest,
    ack: (ack: SubscribeAck) => void,
  ) => void;
  [FORECAST_LIVE_EVENTS.unsubscribe]: (request: SubscribeRequest) => void;
  [ORDER_LIVE_EVENTS.subscribe]: (
    request: SubscribeRequest,
    ack: (ack: SubscribeAck) => void,
  ) => void;
  [ORDER_LIVE_EVENTS.unsubscribe]: (request: SubscribeRequest) => void;
  [ALARM_LIVE_EVENTS.subscribe]: (
    request: SubscribeRequest,
    ack: (ack: SubscribeAck) => void,
  ) => void;
  [ALARM_LIVE_EVENTS.unsubscribe]: (request: SubscribeRequest) => void;
  [LOGBOOK_LIVE_EVENTS.follow]: (ack: (ack: SubscribeAck) => void) => void;
  [LOGBOOK_LIVE_EVENTS.unfollow]: () => void;
}

type Listener = (...args: never[]) => void;

/** The one place a live connection is made, so sign-in adds its token here. */
export function createLiveSocket(): LiveSocket {
  const socket: Socket<ServerToClient, ClientToServer> = io(
    `${env.gatewayOrigin}${LIVE_NAMESPACE}`,
    {
      path: '/socket.io',
      autoConnect: false,
      // read at every (re)connect, so a renewed token is used
      auth: (cb) => cb({ token: session()?.accessToken ?? '' }),
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
    subscribeForecast: (request, onAck) =>
      void socket.emit(FORECAST_LIVE_EVENTS.subscribe, request, onAck),
    unsubscribeForecast: (request) => void socket.emit(FORECAST_LIVE_EVENTS.unsubscribe, request),
    subscribeOrders: (request, onAck) =>
      void socket.emit(ORDER_LIVE_EVENTS.subscribe, request, onAck),
    unsubscribeOrders: (request) => void socket.emit(ORDER_LIVE_EVENTS.unsubscribe, request),
    subscribeAlarms: (request, onAck) =>
      void socket.emit(ALARM_LIVE_EVENTS.subscribe, request, onAck),
    unsubscribeAlarms: (request) => void socket.emit(ALARM_LIVE_EVENTS.unsubscribe, request),
    followLogbook: (onAck) => void socket.emit(LOGBOOK_LIVE_EVENTS.follow, onAck),
    unfollowLogbook: () => void socket.emit(LOGBOOK_LIVE_EVENTS.unfollow),
  };
}
