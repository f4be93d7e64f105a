import { describe, expect, it } from 'vitest';
import { clockTopic, commandTopic, parseTopic, telemetryTopic } from './topics.js';

describe('topics', () => {
  it('builds and reads back each kind of topic', () => {
    expect(parseTopic(telemetryTopic('lake-orrin', 'pool-radar'))).toEqual({
      kind: 'telemetry',
      reservoirId: 'lake-orrin',
      deviceId: 'pool-radar',
    });
    expect(parseTopic(commandTopic('lake-orrin', 'gate-controller'))?.kind).toBe('command');
    expect(parseTopic(clockTopic('lake-orrin'))).toEqual({
      kind: 'clock',
      reservoirId: 'lake-orrin',
    });
  });
  it('refuses ids that would break the topic tree', () => {
    expect(() => telemetryTopic('lake/orrin', 'x')).toThrow(/reservoir id "lake\/orrin"/);
    expect(() => telemetryTopic('lake-orrin', '+')).toThrow(/device id/);
  });
  it.each([
    'other/v1/a/telemetry/b',
    'stillwell/v2/a/telemetry/b',
    'stillwell/v1/a/telemetry',
    'stillwell/v1/a/telemetry/b/c',
    'stillwell/v1/A/telemetry/b',
  ])('reads %s as no Stillwell topic', (topic) => expect(parseTopic(topic)).toBeNull());
});
