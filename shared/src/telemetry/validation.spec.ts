import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR } from '../reservoirs/demo.js';
import { telemetryMessageSchema } from './message.js';
import { validateTelemetry, type ValidationContext } from './validation.js';

const NOW = Date.parse('2026-12-01T12:00:00Z');
const ctx: ValidationContext = {
  topicDeviceId: 'pool-radar',
  channels: new Map(DEMO_RESERVOIR.channels.map((c) => [c.id, c])),
  nowMs: NOW,
  maxFutureMs: 120_000,
};
const good = {
  deviceId: 'pool-radar',
  channel: 'pool.radar',
  seq: 41,
  time: '2026-12-01T11:59:30Z',
  value: 204.51,
  unit: 'm',
  quality: 'good',
};
const check = (over: Record<string, unknown>, context = ctx) =>
  validateTelemetry(JSON.stringify({ ...good, ...over }), context);

describe('telemetry message schema', () => {
  it('accepts a well-formed message', () => {
    expect(telemetryMessageSchema.parse(good)).toEqual(good);
  });
  it.each([
    ['a missing field', { value: undefined }, 'value'],
    ['a negative sequence number', { seq: -1 }, 'seq'],
    ['a fractional sequence number', { seq: 1.5 }, 'seq'],
    ['a time without a zone', { time: '2026-12-01T11:59:30' }, 'time'],
    ['a string value', { value: '204.5' }, 'value'],
    ['an unknown unit', { unit: 'furlong' }, 'unit'],
    ['an unknown quality', { quality: 'fine' }, 'quality'],
    ['an extra field', { note: 'hi' }, ''],
    ['an upper-case device id', { deviceId: 'Pool-Radar' }, 'deviceId'],
  ])('rejects %s', (_what, over, field) => {
    const result = telemetryMessageSchema.safeParse({ ...good, ...over });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.path.join('.')).toBe(field);
  });
});

describe('validateTelemetry', () => {
  it('accepts a good reading and normalises the time to UTC', () => {
    const r = check({ time: '2026-12-01T12:59:30+01:00' });
    expect(r).toMatchObject({
      ok: true,
      reading: { value: 204.51, time: '2026-12-01T11:59:30.000Z' },
    });
  });
  it('converts a reading in another unit of the same quantity to the channel unit', () => {
    const r = check({ value: 671, unit: 'ft' });
    expect(r.ok && r.reading.value).toBeCloseTo(204.5208, 9); // 671 ft x 0.3048 m/ft (NIST SP 811)
    expect(r.ok && r.reading.unit).toBe('m');
  });
  it.each([
    ['not JSON', '{"seq": 1', 'not-json'],
    ['JSON of the wrong shape', '[1,2,3]', 'bad-shape'],
  ])('quarantines %s', (_what, payload, reason) => {
    const r = validateTelemetry(payload, ctx);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.rejection.reason).toBe(reason);
  });
  it.each([
    ['an unknown channel', { channel: 'pool.sonar' }, 'unknown-channel', /pool\.sonar/],
    [
      'a value above the physical range',
      { value: 250 },
      'out-of-range',
      /250 m is outside .*165\.\.220/,
    ],
    ['a value below it', { value: 100 }, 'out-of-range', /outside/],
    ['a unit of another quantity', { unit: 'm3/s' }, 'wrong-unit', /not a unit of length/],
    ['a time far in the future', { time: '2026-12-01T12:10:00Z' }, 'future-time', /600 s ahead/],
    [
      'a channel of another device',
      { channel: 'inflow', deviceId: 'pool-radar', unit: 'm3/s', value: 5 },
      'device-mismatch',
      /belongs to device "inflow-gauge"/,
    ],
  ])('quarantines %s with a reason that says what is wrong', (_what, over, reason, detail) => {
    const r = check(over);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.rejection.reason).toBe(reason);
      expect(r.rejection.detail).toMatch(detail);
    }
  });
  it('refuses a message whose device is not the one of its topic', () => {
    const r = check({}, { ...ctx, topicDeviceId: 'inflow-gauge' });
    expect(!r.ok && r.rejection.reason).toBe('device-mismatch');
  });
  it('allows small clock skew into the future', () => {
    expect(check({ time: '2026-12-01T12:01:00Z' }).ok).toBe(true);
  });
});
