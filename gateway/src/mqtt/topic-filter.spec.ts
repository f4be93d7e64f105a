import { topicMatches } from './topic-filter';

// Cases after the MQTT 3.1.1 OASIS standard, section 4.7.1 (topic wildcards).
describe('topicMatches', () => {
  it.each([
    ['stillwell/v1/+/telemetry/+', 'stillwell/v1/lake-orrin/telemetry/pool-radar', true],
    ['stillwell/v1/+/telemetry/+', 'stillwell/v1/lake-orrin/telemetry', false],
    ['stillwell/v1/+/telemetry/+', 'stillwell/v1/lake-orrin/telemetry/a/b', false],
    ['sport/tennis/player1/#', 'sport/tennis/player1', true],
    ['sport/tennis/player1/#', 'sport/tennis/player1/ranking', true],
    ['sport/#', 'sport', true],
    ['sport/+', 'sport/', true],
    ['+/+', '/finance', true],
    ['sport/+', 'sport', false],
  ])('%s matches %s: %s', (filter, topic, expected) => {
    expect(topicMatches(filter, topic)).toBe(expected);
  });
});
