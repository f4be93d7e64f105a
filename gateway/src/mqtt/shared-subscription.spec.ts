import { subscriptionFilter } from './shared-subscription';

// MQTT 5.0 OASIS standard, 4.8.2: a shared subscription is "$share/{ShareName}/{filter}".
describe('subscriptionFilter', () => {
  it.each([
    ['stillwell/v1/+/telemetry/+', 'ingest', '$share/ingest/stillwell/v1/+/telemetry/+'],
    ['stillwell/v1/+/backfill-reply/+', 'ingest', '$share/ingest/stillwell/v1/+/backfill-reply/+'],
    ['stillwell/v1/+/clock', 'ingest', 'stillwell/v1/+/clock'],
    ['stillwell/v1/+/ack/+', 'ingest', 'stillwell/v1/+/ack/+'],
    ['stillwell/v1/+/telemetry/+', undefined, 'stillwell/v1/+/telemetry/+'],
  ])('%s in group %s: %s', (filter, group, expected) => {
    expect(subscriptionFilter(filter, group)).toBe(expected);
  });
});
