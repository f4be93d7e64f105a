import { convert, quantityOf, type Unit } from '../units/units.js';
import { describeIssues, telemetryMessageSchema, type TelemetryMessage } from './message.js';
import type { ChannelDefinition } from '../reservoirs/definition.js';

/** Why a message was quarantined. Stable codes: they are stored and counted. */
export const QUARANTINE_REASONS = [
  'not-json',
  'bad-shape',
  'bad-topic',
  'device-mismatch',
  'unknown-reservoir',
  'unknown-channel',
  'wrong-unit',
  'out-of-range',
  'future-time',
] as const;
export type QuarantineReason = (typeof QUARANTINE_REASONS)[number];

export interface Rejection {
  reason: QuarantineReason;
  detail: string;
}

/** A message accepted for storage, its value converted to the channel's SI unit. */
export interface AcceptedReading extends TelemetryMessage {
  timeMs: number;
}

export type ValidationResult =
  { ok: true; reading: AcceptedReading } | { ok: false; rejection: Rejection };

export interface ValidationContext {
  /** the device id from the topic the message came on */
  topicDeviceId: string;
  /** channel definitions of the reservoir, by channel id */
  channels: ReadonlyMap<string, ChannelDefinition>;
  /** the site's current time, epoch ms */
  nowMs: number;
  /** how far ahead of the site clock a measurement time may be (clock skew) */
  maxFutureMs: number;
}

const reject = (reason: QuarantineReason, detail: string): ValidationResult => ({
  ok: false,
  rejection: { reason, detail },
});

/** Checks a raw payload completely; never throws. */
export function validateTelemetry(payload: string, ctx: ValidationContext): ValidationResult {
  let json: unknown;
  try {
    json = JSON.parse(payload);
  } catch (error) {
    return reject('not-json', `payload is not JSON: ${(error as Error).message}`);
  }
  const parsed = telemetryMessageSchema.safeParse(json);
  if (!parsed.success) return reject('bad-shape', describeIssues(parsed.error));
  const msg = parsed.data;
  if (msg.deviceId !== ctx.topicDeviceId) {
    return reject(
      'device-mismatch',
      `deviceId "${msg.deviceId}" does not match the topic's device "${ctx.topicDeviceId}"`,
    );
  }
  const channel = ctx.channels.get(msg.channel);
  if (!channel)
    return reject('unknown-channel', `channel "${msg.channel}" is not defined for this reservoir`);
  if (channel.deviceId !== msg.deviceId) {
    return reject(
      'device-mismatch',
      `channel "${msg.channel}" belongs to device "${channel.deviceId}", not "${msg.deviceId}"`,
    );
  }
  if (quantityOf(msg.unit) !== quantityOf(channel.unit as Unit)) {
    return reject(
      'wrong-unit',
      `unit "${msg.unit}" is not a unit of ${quantityOf(channel.unit)} (channel unit ${channel.unit})`,
    );
  }
  const value = convert(msg.value, msg.unit, channel.unit);
  if (value < channel.min || value > channel.max) {
    return reject(
      'out-of-range',
      `value ${value} ${channel.unit} is outside the physical range ${channel.min}..${channel.max} ${channel.unit}`,
    );
  }
  const timeMs = Date.parse(msg.time);
  if (timeMs - ctx.nowMs > ctx.maxFutureMs) {
    return reject(
      'future-time',
      `time ${msg.time} is ${Math.round((timeMs - ctx.nowMs) / 1000)} s ahead of the site clock`,
    );
  }
  return {
    ok: true,
    reading: { ...msg, value, unit: channel.unit, time: new Date(timeMs).toISOString(), timeMs },
  };
}
