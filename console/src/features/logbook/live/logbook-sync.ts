import type { QueryClient } from '@tanstack/react-query';
import {
  logbookEntrySchema,
  type LogbookEntry,
  type LogbookHead,
  type LogbookPage,
} from '@stillwell/shared/logbook';
import { describeIssues, type SubscribeAck } from '@stillwell/shared/telemetry';
import type { LiveSocket } from '../../../lib/live-socket';
import { logbookKeys } from '../api/keys';
import { matchesFilter, type LogbookView } from '../utils/filters';

export interface LogbookSyncOptions {
  socket: LiveSocket;
  queryClient: QueryClient;
  /** the view on screen: new entries go into it directly when it shows the newest first */
  view: () => LogbookView;
  /** an entry that belongs to the filter but not on the page shown (an older page, another sort) */
  onNewElsewhere?: () => void;
  onIssue?: (message: string | null) => void;
}

/**
 * New entries, pushed after their commit, into the query cache: the newest-first first page gets
 * them at its top; other views count them for a refresh the operator chooses. After a reconnect
 * the pages are fetched again (socket.io keeps nothing for a client while it is away).
 */
export function startLogbookSync(options: LogbookSyncOptions): () => void {
  const { socket, queryClient, view, onNewElsewhere, onIssue } = options;
  // entries pushed lately: a page fetched while they arrived may not hold them yet
  let recent: LogbookEntry[] = [];

  const merge = (v: LogbookView, entries: readonly LogbookEntry[]) =>
    queryClient.setQueryData<LogbookPage>(logbookKeys.page(v), (old) => {
      if (!old) return old;
      const fresh = entries.filter(
        (e) =>
          matchesFilter(e, v.filter) &&
          !old.rows.some((r) => r.seq === e.seq) &&
          e.seq > (old.rows[0]?.seq ?? 0),
      );
      if (!fresh.length) return old;
      const rows = [...fresh].sort((a, b) => b.seq - a.seq);
      return { rows: [...rows, ...old.rows].slice(0, v.pageSize), total: old.total + fresh.length };
    });
  const newestFirst = (v: LogbookView) =>
    v.page === 0 && (v.sort === 'seq' || v.sort === 'time') && v.order === 'desc';

  const follow = () =>
    socket.followLogbook((ack: SubscribeAck | undefined) => {
      if (!ack?.ok)
        return onIssue?.(`The live logbook was refused: ${ack?.error ?? 'no reason given'}`);
      onIssue?.(null);
      void queryClient.invalidateQueries({ queryKey: logbookKeys.all() });
    });

  const onEntry = (payload: unknown) => {
    const parsed = logbookEntrySchema.safeParse(payload);
    if (!parsed.success)
      return onIssue?.(`An unreadable entry was pushed: ${describeIssues(parsed.error)}`);
    const entry = parsed.data;
    queryClient.setQueryData<LogbookHead>(logbookKeys.head(), (old) =>
      old && old.seq !== null && old.seq >= entry.seq
        ? old
        : { seq: entry.seq, hash: entry.hash, time: entry.time },
    );
    recent = [...recent.filter((e) => e.seq !== entry.seq), entry]
      .sort((a, b) => a.seq - b.seq)
      .slice(-100);
    const v = view();
    if (!matchesFilter(entry, v.filter)) return;
    if (!newestFirst(v)) return onNewElsewhere?.();
    merge(v, [entry]);
  };

  const stopWatching = queryClient.getQueryCache().subscribe((event) => {
    if (event.type !== 'updated' || event.action.type !== 'success' || event.action.manual) return;
    const key = event.query.queryKey;
    const newest = recent.at(-1);
    if (key[0] === 'logbook' && key[1] === 'head' && newest) {
      const head = event.query.state.data as LogbookHead | undefined;
      if (!head || head.seq === null || head.seq < newest.seq)
        queryClient.setQueryData<LogbookHead>(logbookKeys.head(), {
          seq: newest.seq,
          hash: newest.hash,
          time: newest.time,
        });
      return;
    }
    if (key[0] !== 'logbook' || key[1] !== 'page') return;
    const v = key[2] as LogbookView;
    if (newestFirst(v) && recent.length) merge(v, recent);
  });

  socket.on('connect', follow);
  socket.on('logbook-entry', onEntry);
  if (socket.connected) follow();
  return () => {
    stopWatching();
    socket.off('connect', follow);
    socket.off('logbook-entry', onEntry);
    if (socket.connected) socket.unfollowLogbook();
  };
}
