import { queryOptions, useQuery, type QueryKey } from '@tanstack/react-query';
import { readingSeriesSchema, type ReadingSeries } from '@stillwell/shared/telemetry';
import { apiGet } from '../../../lib/api-client';
import { getReservoirStatusQueryOptions } from './get-reservoir-status';

export interface ChannelReadingsRequest {
  reservoirId: string;
  channel: string;
  /** epoch ms, site time */
  from: number;
  to: number;
  signal?: AbortSignal;
}

export function getChannelReadings(request: ChannelReadingsRequest): Promise<ReadingSeries> {
  const { reservoirId, channel, from, to, signal } = request;
  return apiGet(
    `/api/reservoirs/${encodeURIComponent(reservoirId)}/channels/${encodeURIComponent(channel)}/readings`,
    readingSeriesSchema,
    { signal, query: { from: new Date(from).toISOString(), to: new Date(to).toISOString() } },
  );
}

export const channelReadingsKeyPrefix = (reservoirId: string) =>
  ['reservoirs', reservoirId, 'readings'] as const;

/** One key per channel and window length: the window's end moves with the site clock. */
export const channelReadingsQueryKey = (reservoirId: string, channel: string, windowMs: number) =>
  [...channelReadingsKeyPrefix(reservoirId), channel, windowMs] as const;

/** The channel and window of a readings key, or null for any other key. */
export function parseChannelReadingsKey(
  key: QueryKey,
): { reservoirId: string; channel: string; windowMs: number } | null {
  const [root, reservoirId, kind, channel, windowMs] = key;
  if (root !== 'reservoirs' || kind !== 'readings') return null;
  if (typeof reservoirId !== 'string' || typeof channel !== 'string') return null;
  if (typeof windowMs !== 'number') return null;
  return { reservoirId, channel, windowMs };
}

export function getChannelReadingsQueryOptions(
  reservoirId: string,
  channel: string,
  windowMs: number,
) {
  return queryOptions({
    queryKey: channelReadingsQueryKey(reservoirId, channel, windowMs),
    queryFn: async ({ client, signal }) => {
      // The window ends at the site's now (plant time), never at this computer's clock; a fresh
      // status gives it, shared with any status fetch already under way.
      const status = await client.fetchQuery({
        ...getReservoirStatusQueryOptions(reservoirId),
        staleTime: 0,
      });
      const to = status.clock.now;
      return getChannelReadings({ reservoirId, channel, from: to - windowMs, to, signal });
    },
    // Live pushes append to it; every (re)subscribe refetches it.
    staleTime: Infinity,
  });
}

export function useChannelReadings(reservoirId: string, channel: string | null, windowMs: number) {
  return useQuery({
    ...getChannelReadingsQueryOptions(reservoirId, channel ?? '', windowMs),
    enabled: channel !== null,
  });
}
