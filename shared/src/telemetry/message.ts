import { z } from 'zod';
import { UNITS } from '../units/units.js';

export const QUALITIES = ['good', 'suspect', 'bad'] as const;
export const qualitySchema = z.enum(QUALITIES);
export type Quality = z.infer<typeof qualitySchema>;

export const idSchema = z
  .string()
  .regex(/^[a-z0-9][a-z0-9-]{0,63}$/, "lower-case letters, digits and '-', at most 64");
export const channelIdSchema = z
  .string()
  .regex(/^[a-z0-9][a-z0-9.-]{0,63}$/, "lower-case letters, digits, '.' and '-', at most 64");

/** One measurement as a device publishes it (JSON, one channel per message). */
export const telemetryMessageSchema = z.strictObject({
  deviceId: idSchema,
  channel: channelIdSchema,
  /** per-device sequence number, increasing by one for every message the device produces */
  seq: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER),
  /** measurement time, ISO 8601 with an offset (UTC 'Z' recommended) */
  time: z.iso.datetime({ offset: true }),
  value: z.number().refine(Number.isFinite, 'must be a finite number'),
  unit: z.enum(UNITS),
  quality: qualitySchema,
});
export type TelemetryMessage = z.infer<typeof telemetryMessageSchema>;

/** The simulator's clock, published retained so that the gateway runs on plant time in the demo. */
export const siteClockMessageSchema = z.strictObject({
  /** plant time at the moment of publishing */
  siteTime: z.iso.datetime({ offset: true }),
  /** how many plant seconds pass per wall-clock second */
  speed: z.number().positive().max(100_000),
});
export type SiteClockMessage = z.infer<typeof siteClockMessageSchema>;

/** Formats zod issues as "field: problem; field: problem" for quarantine reasons and API errors. */
export function describeIssues(error: z.ZodError): string {
  return error.issues
    .map((issue) => `${issue.path.length ? issue.path.join('.') : '(message)'}: ${issue.message}`)
    .join('; ');
}
