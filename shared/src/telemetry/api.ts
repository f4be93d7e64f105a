import { z } from 'zod';
import { qualitySchema } from './message.js';
import { UNITS } from '../units/units.js';

/** Shapes the gateway serves and the console reads (REST and socket.io). */

export const readingSchema = z.strictObject({
  reservoirId: z.string(),
  deviceId: z.string(),
  channel: z.string(),
  seq: z.number().int(),
  /** measurement time, epoch ms */
  t: z.number(),
  /** value in the channel's SI unit */
  v: z.number(),
  q: qualitySchema,
});
export type Reading = z.infer<typeof readingSchema>;

/** A channel's readings over a range, columnar so a chart can take them as they are. */
export const readingSeriesSchema = z.strictObject({
  channel: z.string(),
  unit: z.enum(UNITS),
  t: z.array(z.number()),
  v: z.array(z.number()),
  q: z.array(qualitySchema),
});
export type ReadingSeries = z.infer<typeof readingSeriesSchema>;

export const siteClockSchema = z.strictObject({
  /** the site's current time, epoch ms (plant time in the demo, the wall clock in production) */
  now: z.number(),
  /** plant seconds per wall second: 1 in production */
  speed: z.number(),
  simulated: z.boolean(),
});
export type SiteClock = z.infer<typeof siteClockSchema>;

export const channelStateSchema = z.strictObject({
  channel: z.string(),
  deviceId: z.string(),
  value: z.number(),
  unit: z.enum(UNITS),
  quality: qualitySchema,
  seq: z.number().int(),
  /** measurement time, epoch ms */
  t: z.number(),
  /** site time since the measurement, s */
  ageS: z.number(),
  stale: z.boolean(),
});
export type ChannelState = z.infer<typeof channelStateSchema>;

/** The overview's numbers, derived by the gateway so that every screen shows the same ones. */
export const reservoirStatusSchema = z.strictObject({
  reservoirId: z.string(),
  clock: siteClockSchema,
  pool: z
    .strictObject({
      elevation: z.number(),
      /** the gauge the elevation came from */
      source: z.string(),
      freeboard: z.number(),
      /** m per hour, positive rising; null until enough readings */
      rateOfRise: z.number().nullable(),
    })
    .nullable(),
  inflow: z.number().nullable(),
  outflow: z.number().nullable(),
  channels: z.array(channelStateSchema),
  ingestion: z.strictObject({
    stored: z.number().int(),
    quarantined: z.number().int(),
    gaps: z.number().int(),
  }),
});
export type ReservoirStatus = z.infer<typeof reservoirStatusSchema>;

export const reservoirSummarySchema = z.strictObject({
  id: z.string(),
  name: z.string(),
  damName: z.string(),
  timeZone: z.string(),
  version: z.number().int(),
});
export type ReservoirSummary = z.infer<typeof reservoirSummarySchema>;

/** socket.io: namespace and event names, so both sides spell them once. */
export const LIVE_NAMESPACE = '/live';
export const LIVE_EVENTS = {
  /** client -> server: { reservoirId }, answered by an ack { ok, error? } */
  subscribe: 'subscribe',
  unsubscribe: 'unsubscribe',
  /** server -> client: Reading[] as stored, in one batch */
  readings: 'readings',
  /** server -> client: ReservoirStatus */
  status: 'status',
} as const;

export const subscribeRequestSchema = z.strictObject({ reservoirId: z.string().min(1).max(64) });
export type SubscribeRequest = z.infer<typeof subscribeRequestSchema>;
export interface SubscribeAck {
  ok: boolean;
  error?: string;
}

/** socket.io event maps on the live namespace, for typed clients and servers. */
export interface LiveServerToClientEvents {
  readings: (batch: Reading[]) => void;
  status: (status: ReservoirStatus) => void;
}
export interface LiveClientToServerEvents {
  subscribe: (request: SubscribeRequest, ack: (ack: SubscribeAck) => void) => void;
  unsubscribe: (request: SubscribeRequest, ack: (ack: SubscribeAck) => void) => void;
}
