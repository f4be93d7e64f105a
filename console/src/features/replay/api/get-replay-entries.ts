import { queryOptions, useQuery } from '@tanstack/react-query';
import { replayEntryPageSchema, type ReplayEntry } from '@stillwell/shared/replay';
import { apiGet } from '../../../lib/api-client';
import { isoOf, replayKeys, replayPath } from './keys';

const PAGE = 500;
/** a window with more entries than this is shown in part, and says so */
export const ENTRY_CAP = 20_000;

/** Every logbook entry of the window, in site-time order, following the pages to the end. */
export async function getReplayEntries(
  reservoirId: string,
  fromMs: number,
  toMs: number,
  signal?: AbortSignal,
): Promise<{ entries: ReplayEntry[]; total: number }> {
  const entries: ReplayEntry[] = [];
  let after: string | null = null;
  for (;;) {
    const query: Record<string, string> = {
      from: isoOf(fromMs),
      to: isoOf(toMs),
      limit: String(PAGE),
    };
    if (after) query.after = after;
    const page = await apiGet(replayPath(reservoirId, 'entries'), replayEntryPageSchema, {
      signal,
      query,
    });
    entries.push(...page.entries);
    after = page.next;
    if (!after || entries.length >= ENTRY_CAP) return { entries, total: page.total };
  }
}

export function getReplayEntriesQueryOptions(reservoirId: string, fromMs: number, toMs: number) {
  return queryOptions({
    queryKey: replayKeys.entries(reservoirId, fromMs, toMs),
    queryFn: ({ signal }) => getReplayEntries(reservoirId, fromMs, toMs, signal),
    staleTime: Infinity,
  });
}

export function useReplayEntries(
  reservoirId: string,
  range: { fromMs: number; toMs: number } | null,
) {
  return useQuery({
    ...getReplayEntriesQueryOptions(reservoirId, range?.fromMs ?? 0, range?.toMs ?? 0),
    enabled: range !== null,
  });
}
