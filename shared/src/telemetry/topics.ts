/**
 * MQTT topic layout. Every topic starts with the protocol version so that a future
 * message format can run beside this one on the same broker.
 *   stillwell/v1/{reservoirId}/telemetry/{deviceId}   device -> gateway, QoS 1
 *   stillwell/v1/{reservoirId}/command/{deviceId}     gateway -> device, QoS 1
 *   stillwell/v1/{reservoirId}/ack/{deviceId}         device -> gateway, QoS 1
 *   stillwell/v1/{reservoirId}/clock                  simulator -> gateway, retained
 *   stillwell/v1/{reservoirId}/backfill/{deviceId}    gateway -> device, QoS 1 (resend a seq range)
 *   stillwell/v1/{reservoirId}/backfill-reply/{deviceId}  device -> gateway, QoS 1
 */
export const TOPIC_ROOT = 'stillwell/v1';

const SEGMENT = /^[a-z0-9][a-z0-9-]{0,63}$/;

export function isTopicSegment(value: string): boolean {
  return SEGMENT.test(value);
}

function segment(value: string, what: string): string {
  if (!isTopicSegment(value)) {
    throw new RangeError(
      `${what} "${value}" is not a valid topic segment (lower-case letters, digits, '-')`,
    );
  }
  return value;
}

export function telemetryTopic(reservoirId: string, deviceId: string): string {
  return `${TOPIC_ROOT}/${segment(reservoirId, 'reservoir id')}/telemetry/${segment(deviceId, 'device id')}`;
}

export function commandTopic(reservoirId: string, deviceId: string): string {
  return `${TOPIC_ROOT}/${segment(reservoirId, 'reservoir id')}/command/${segment(deviceId, 'device id')}`;
}

export function ackTopic(reservoirId: string, deviceId: string): string {
  return `${TOPIC_ROOT}/${segment(reservoirId, 'reservoir id')}/ack/${segment(deviceId, 'device id')}`;
}

/** Where the gateway asks a device to resend readings it missed (backfill.ts). */
export function backfillTopic(reservoirId: string, deviceId: string): string {
  return `${TOPIC_ROOT}/${segment(reservoirId, 'reservoir id')}/backfill/${segment(deviceId, 'device id')}`;
}

export function backfillReplyTopic(reservoirId: string, deviceId: string): string {
  return `${TOPIC_ROOT}/${segment(reservoirId, 'reservoir id')}/backfill-reply/${segment(deviceId, 'device id')}`;
}

export function clockTopic(reservoirId: string): string {
  return `${TOPIC_ROOT}/${segment(reservoirId, 'reservoir id')}/clock`;
}

/** Subscriptions the gateway makes (MQTT 3.1.1 single-level wildcards). */
export const TELEMETRY_SUBSCRIPTION = `${TOPIC_ROOT}/+/telemetry/+`;
export const ACK_SUBSCRIPTION = `${TOPIC_ROOT}/+/ack/+`;
export const CLOCK_SUBSCRIPTION = `${TOPIC_ROOT}/+/clock`;
export const BACKFILL_REPLY_SUBSCRIPTION = `${TOPIC_ROOT}/+/backfill-reply/+`;

export type TopicKind = 'telemetry' | 'command' | 'ack' | 'clock' | 'backfill' | 'backfill-reply';
const DEVICE_KINDS: readonly string[] = [
  'telemetry',
  'command',
  'ack',
  'backfill',
  'backfill-reply',
];

export interface ParsedTopic {
  kind: TopicKind;
  reservoirId: string;
  deviceId?: string;
}

/** Reads a Stillwell topic; returns null for anything that is not one. */
export function parseTopic(topic: string): ParsedTopic | null {
  const parts = topic.split('/');
  if (parts[0] !== 'stillwell' || parts[1] !== 'v1') return null;
  const reservoirId = parts[2];
  const kind = parts[3];
  if (!reservoirId || !isTopicSegment(reservoirId)) return null;
  if (kind === 'clock' && parts.length === 4) return { kind, reservoirId };
  if (kind && DEVICE_KINDS.includes(kind) && parts.length === 5) {
    const deviceId = parts[4];
    if (!deviceId || !isTopicSegment(deviceId)) return null;
    return { kind: kind as TopicKind, reservoirId, deviceId };
  }
  return null;
}
