import type { QueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  describeIssues,
  readingSchema,
  reservoirStatusSchema,
  type Reading,
  type ReadingSeries,
  type ReservoirStatus,
  type SubscribeAck,
} from '@stillwell/shared/telemetry';
import type { LiveSocket } from '../../../lib/live-socket';
import { channelReadingsKeyPrefix, parseChannelReadingsKey } from '../api/get-channel-readings';
import { reservoirStatusQueryKey } from '../api/get-reservoir-status';
import { appendReadings } from '../utils/append-readings';

const readingBatchSchema = z.array(readingSchema);

export interface LiveSyncOptions {
  socket: LiveSocket;
  queryClient: QueryClient;
  reservoirId: string;
  /** told when the gateway refuses the subscription or pushes something unreadable */
  onIssue?: (message: string | null) => void;
  /**
   * How long pushed readings are kept (wall ms) to be merged into a range fetched meanwhile: a
   * fetch replaces the cached series, and pushes that came during it would otherwise be lost.
   */
  tailMs?: number;
  /** wall clock, for the tail only */
  now?: () => number;
}

const MAX_TAIL = 5000;

/**
 * Feeds one reservoir's live pushes into the query cache, so that screens read one source.
 * Subscribes on every connect and then refetches status and readings, because socket.io keeps
 * nothing for a client while it is away. Returns the function that stops it.
 */
export function startLiveSync(options: LiveSyncOptions): () => void {
  const { socket, queryClient, reservoirId, onIssue } = options;
  const tailMs = options.tailMs ?? 15_000;
  const now = options.now ?? Date.now;
  const statusKey = reservoirStatusQueryKey(reservoirId);
  const readingsPrefix = channelReadingsKeyPrefix(reservoirId);
  let tail: { at: number; reading: Reading }[] = [];

  const subscribe = () => {
    socket.subscribe({ reservoirId }, (ack: SubscribeAck | undefined) => {
      if (!ack?.ok) {
        onIssue?.(
          `The gateway refused live data for this reservoir: ${ack?.error ?? 'no reason given'}`,
        );
        return;
      }
      onIssue?.(null);
      void queryClient.invalidateQueries({ queryKey: statusKey });
      void queryClient.invalidateQueries({ queryKey: readingsPrefix });
    });
  };

  const onStatus = (payload: unknown) => {
    const parsed = reservoirStatusSchema.safeParse(payload);
    if (!parsed.success) {
      onIssue?.(`An unreadable status was pushed: ${describeIssues(parsed.error)}`);
      return;
    }
    const next = parsed.data;
    if (next.reservoirId !== reservoirId) return;
    // A REST answer that raced a push must not wind the clock back.
    queryClient.setQueryData<ReservoirStatus>(statusKey, (old) =>
      old && old.clock.now > next.clock.now ? old : next,
    );
  };

  const mergeIntoCache = (readings: readonly Reading[], onlyKey?: readonly unknown[]) => {
    const entries = onlyKey
      ? [[onlyKey, queryClient.getQueryData<ReadingSeries>(onlyKey)] as const]
      : queryClient.getQueriesData<ReadingSeries>({ queryKey: readingsPrefix });
    for (const [key, series] of entries) {
      const parsedKey = parseChannelReadingsKey(key);
      if (!series || !parsedKey) continue;
      const merged = appendReadings(series, readings, parsedKey.windowMs);
      if (merged !== series) queryClient.setQueryData(key, merged);
    }
  };

  const onReadings = (payload: unknown) => {
    const parsed = readingBatchSchema.safeParse(payload);
    if (!parsed.success) {
      onIssue?.(`Unreadable readings were pushed: ${describeIssues(parsed.error)}`);
      return;
    }
    const mine = parsed.data.filter((r) => r.reservoirId === reservoirId);
    if (mine.length === 0) return;
    const at = now();
    tail = tail.filter((entry) => at - entry.at <= tailMs);
    for (const reading of mine) tail.push({ at, reading });
    if (tail.length > MAX_TAIL) tail = tail.slice(tail.length - MAX_TAIL);
    mergeIntoCache(mine);
  };

  const stopWatchingCache = queryClient.getQueryCache().subscribe((event) => {
    if (event.type !== 'updated' || event.action.type !== 'success' || event.action.manual) return;
    const parsedKey = parseChannelReadingsKey(event.query.queryKey);
    if (!parsedKey || parsedKey.reservoirId !== reservoirId) return;
    const recent = tail
      .filter((entry) => entry.reading.channel === parsedKey.channel)
      .map((entry) => entry.reading);
    if (recent.length > 0) mergeIntoCache(recent, event.query.queryKey);
  });

  socket.on('connect', subscribe);
  socket.on('status', onStatus);
  socket.on('readings', onReadings);
  if (socket.connected) subscribe();

  return () => {
    socket.off('connect', subscribe);
    socket.off('status', onStatus);
    socket.off('readings', onReadings);
    stopWatchingCache();
    if (socket.connected) socket.unsubscribe({ reservoirId });
  };
}
