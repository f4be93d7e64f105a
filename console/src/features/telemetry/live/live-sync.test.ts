import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { QueryClient } from '@tanstack/react-query';
import type { ReadingSeries, ReservoirStatus } from '@stillwell/shared/telemetry';
import { FakeLiveSocket } from '../../../testing/fake-live-socket';
import {
  definition,
  makeReading,
  makeSeries,
  makeStatus,
  SITE_NOW,
} from '../../../testing/fixtures';
import { createTestQueryClient } from '../../../testing/render-app';
import { channelReadingsQueryKey } from '../api/get-channel-readings';
import { reservoirStatusQueryKey } from '../api/get-reservoir-status';
import { startLiveSync } from './live-sync';

const WINDOW = 6 * 3_600_000;
const poolKey = channelReadingsQueryKey(definition.id, 'pool.radar', WINDOW);
const statusKey = reservoirStatusQueryKey(definition.id);

describe('startLiveSync', () => {
  let socket: FakeLiveSocket;
  let queryClient: QueryClient;
  let issues: (string | null)[];
  let stop: () => void;

  beforeEach(() => {
    socket = new FakeLiveSocket();
    queryClient = createTestQueryClient();
    issues = [];
    stop = startLiveSync({
      socket,
      queryClient,
      reservoirId: definition.id,
      onIssue: (issue) => issues.push(issue),
    });
  });

  afterEach(() => {
    stop();
    queryClient.clear();
  });

  it('subscribes on connect, and again on every reconnect', () => {
    expect(socket.subscriptions).toHaveLength(0);
    socket.serverConnects();
    socket.serverDrops();
    socket.serverConnects();
    expect(socket.subscriptions.map((s) => s.request)).toEqual([
      { reservoirId: definition.id },
      { reservoirId: definition.id },
    ]);
  });

  it('refetches status and readings once the subscription is accepted', () => {
    queryClient.setQueryData(statusKey, makeStatus());
    queryClient.setQueryData(poolKey, makeSeries('pool.radar', [[SITE_NOW, 207]]));
    socket.serverConnects();
    expect(queryClient.getQueryState(statusKey)?.isInvalidated).toBe(false);
    socket.subscriptions[0]?.ack({ ok: true });
    expect(queryClient.getQueryState(statusKey)?.isInvalidated).toBe(true);
    expect(queryClient.getQueryState(poolKey)?.isInvalidated).toBe(true);
  });

  it('reports a refused subscription', () => {
    socket.serverConnects();
    socket.subscriptions[0]?.ack({ ok: false, error: 'unknown reservoir' });
    expect(issues.at(-1)).toContain('unknown reservoir');
  });

  it('puts pushed statuses of its reservoir into the cache, never winding the clock back', () => {
    const first = makeStatus();
    socket.push('status', first);
    expect(queryClient.getQueryData(statusKey)).toEqual(first);
    socket.push('status', makeStatus({ clock: { ...first.clock, now: SITE_NOW - 1000 } }));
    expect(queryClient.getQueryData<ReservoirStatus>(statusKey)?.clock.now).toBe(SITE_NOW);
    socket.push('status', makeStatus({ reservoirId: 'another-lake', inflow: 1 }));
    expect(queryClient.getQueryData<ReservoirStatus>(statusKey)?.inflow).toBe(first.inflow);
  });

  it('refuses a malformed status and says so', () => {
    socket.push('status', { reservoirId: definition.id, clock: 'soon' });
    expect(queryClient.getQueryData(statusKey)).toBeUndefined();
    expect(issues.at(-1)).toMatch(/unreadable status/i);
  });

  it('appends pushed readings to the cached series of their channel', () => {
    queryClient.setQueryData(poolKey, makeSeries('pool.radar', [[SITE_NOW - 60_000, 207]]));
    socket.push('readings', [
      makeReading('pool.radar', SITE_NOW, 207.02),
      makeReading('inflow', SITE_NOW, 900),
      { ...makeReading('pool.radar', SITE_NOW + 1, 100), reservoirId: 'another-lake' },
    ]);
    const series = queryClient.getQueryData<ReadingSeries>(poolKey);
    expect(series?.t).toEqual([SITE_NOW - 60_000, SITE_NOW]);
    expect(series?.v).toEqual([207, 207.02]);
  });

  it('merges readings pushed during a refetch into the range it brings back', async () => {
    queryClient.setQueryData(poolKey, makeSeries('pool.radar', [[SITE_NOW - 60_000, 207]]));
    let answer: (series: ReadingSeries) => void = () => undefined;
    const refetch = queryClient.fetchQuery({
      queryKey: poolKey,
      queryFn: () => new Promise<ReadingSeries>((resolve) => (answer = resolve)),
    });
    // Pushed while the range is on its way; the range ends before it.
    socket.push('readings', [makeReading('pool.radar', SITE_NOW + 30_000, 207.05)]);
    answer(
      makeSeries('pool.radar', [
        [SITE_NOW - 60_000, 207],
        [SITE_NOW, 207.02],
      ]),
    );
    await refetch;
    expect(queryClient.getQueryData<ReadingSeries>(poolKey)?.t).toEqual([
      SITE_NOW - 60_000,
      SITE_NOW,
      SITE_NOW + 30_000,
    ]);
  });

  it('lets go of the socket and unsubscribes when stopped', () => {
    socket.serverConnects();
    stop();
    expect(socket.listenerCount('readings')).toBe(0);
    expect(socket.listenerCount('status')).toBe(0);
    expect(socket.unsubscriptions).toEqual([{ reservoirId: definition.id }]);
    stop = () => undefined;
  });
});
