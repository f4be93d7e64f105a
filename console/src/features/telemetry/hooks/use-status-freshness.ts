import type { ReservoirStatus } from '@stillwell/shared/telemetry';
import { STATUS_OVERDUE_MS } from '../../../config/display';
import { useWallClock } from '../../../hooks/use-wall-clock';

export interface StatusFreshness {
  /** no status for longer than expected: what is shown may have moved on */
  overdue: boolean;
  /** site seconds since the status, estimated from the clock's speed; null while not overdue */
  overdueSiteS: number | null;
}

/** Pure part of useStatusFreshness. */
export function statusFreshness(
  status: ReservoirStatus,
  receivedAtWallMs: number,
  wallNowMs: number,
): StatusFreshness {
  const sinceMs = Math.max(0, wallNowMs - receivedAtWallMs);
  if (sinceMs <= STATUS_OVERDUE_MS) return { overdue: false, overdueSiteS: null };
  return { overdue: true, overdueSiteS: (sinceMs * status.clock.speed) / 1000 };
}

/** Watches for the status going quiet; receivedAt is the query's dataUpdatedAt. */
export function useStatusFreshness(
  status: ReservoirStatus | undefined,
  receivedAtWallMs: number,
): StatusFreshness {
  const wallNow = useWallClock(1000);
  if (!status) return { overdue: false, overdueSiteS: null };
  return statusFreshness(status, receivedAtWallMs, wallNow);
}
