import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';
import type { LogbookEntry, LogbookPage } from '@stillwell/shared/logbook';
import { FakeLiveSocket } from '../../../testing/fake-live-socket';
import { logbookKeys } from '../api/keys';
import { DEFAULT_VIEW, NO_FILTER, type LogbookView } from '../utils/filters';
import { startLogbookSync } from './logbook-sync';

const entry = (seq: number, kind = 'shift.note'): LogbookEntry => ({
  seq,
  time: new Date(Date.UTC(2026, 2, 3, 14, seq)).toISOString(),
  actorId: 'u1',
  actorName: 'operator',
  actorRoles: ['operator'],
  kind,
  payload: { text: `note ${seq}` },
  prevHash: '0'.repeat(64),
  hash: String(seq).padStart(64, 'a'),
});

function setup(view: LogbookView) {
  const socket = new FakeLiveSocket();
  const queryClient = new QueryClient();
  let elsewhere = 0;
  queryClient.setQueryData<LogbookPage>(logbookKeys.page(view), {
    rows: [entry(2), entry(1)],
    total: 2,
  });
  const stop = startLogbookSync({
    socket,
    queryClient,
    view: () => view,
    onNewElsewhere: () => (elsewhere += 1),
  });
  socket.serverConnects();
  socket.logbookFollows[0]!({ ok: true });
  return { socket, queryClient, stop, elsewhere: () => elsewhere };
}

describe('the live logbook', () => {
  it('puts a new entry at the top of the newest-first page, and moves the head', () => {
    const { socket, queryClient } = setup(DEFAULT_VIEW);
    socket.push('logbook-entry', entry(3));
    socket.push('logbook-entry', entry(3));
    const page = queryClient.getQueryData<LogbookPage>(logbookKeys.page(DEFAULT_VIEW))!;
    expect(page.rows.map((r) => r.seq)).toEqual([3, 2, 1]);
    expect(page.total).toBe(3);
    expect(queryClient.getQueryData(logbookKeys.head())).toMatchObject({ seq: 3 });
  });

  it('leaves out entries the filter does not take, and counts those for another page', () => {
    const filtered = { ...DEFAULT_VIEW, filter: { ...NO_FILTER, kind: 'order.' } };
    const a = setup(filtered);
    a.socket.push('logbook-entry', entry(3, 'shift.note'));
    expect(a.queryClient.getQueryData<LogbookPage>(logbookKeys.page(filtered))!.rows).toHaveLength(
      2,
    );
    const older = { ...DEFAULT_VIEW, page: 2 };
    const b = setup(older);
    b.socket.push('logbook-entry', entry(4));
    expect(b.elsewhere()).toBe(1);
    expect(b.queryClient.getQueryData<LogbookPage>(logbookKeys.page(older))!.rows).toHaveLength(2);
  });

  it('refuses an unreadable push without touching the cache', () => {
    const { socket, queryClient } = setup(DEFAULT_VIEW);
    socket.push('logbook-entry', { seq: 'x' });
    expect(
      queryClient.getQueryData<LogbookPage>(logbookKeys.page(DEFAULT_VIEW))!.rows,
    ).toHaveLength(2);
  });
});
