/**
 * Filters whose messages one gateway of a group handles, not every one: readings (and replayed
 * readings) are ingested once. Everything else (site clock, command acks, rule events) reaches
 * every gateway, as each keeps its own view of it.
 */
export const SHARED_FILTERS: readonly string[] = [
  'stillwell/v1/+/telemetry/+',
  'stillwell/v1/+/backfill-reply/+',
];

/**
 * The filter to subscribe with: `$share/<group>/<filter>` for a shared filter when a group is set
 * (MQTT 5.0 OASIS standard, 4.8.2 "Shared Subscriptions": each message goes to one session of the
 * group), otherwise the filter itself.
 */
export function subscriptionFilter(filter: string, group: string | undefined): string {
  return group && SHARED_FILTERS.includes(filter) ? `$share/${group}/${filter}` : filter;
}
