import { describe, expect, it } from 'vitest';
import type { Notice, Recipient } from '@stillwell/shared/notices';
import { countsSentence, groupByOrder } from './board';

const recipient = (standing: Recipient['standing']): Recipient =>
  ({ id: `r-${standing}`, standing }) as Recipient;
const notice = (over: Partial<Notice>): Notice =>
  ({
    id: 'n',
    orderId: 'o1',
    zoneName: 'Z',
    distanceM: 1000,
    state: 'sent',
    emergency: false,
    releaseM3s: 500,
    preparedAt: 1,
    recipients: [],
    ...over,
  }) as Notice;

describe('the notices board', () => {
  it('groups by order, newest first, nearest zone first, withdrawn last', () => {
    const groups = groupByOrder([
      notice({ id: 'a', orderId: 'o1', distanceM: 14000, preparedAt: 1 }),
      notice({ id: 'b', orderId: 'o1', distanceM: 1500, preparedAt: 1, state: 'withdrawn' }),
      notice({ id: 'c', orderId: 'o1', distanceM: 3000, preparedAt: 1 }),
      notice({ id: 'd', orderId: 'o2', preparedAt: 5, emergency: true }),
    ]);
    expect(groups.map((g) => g.orderId)).toEqual(['o2', 'o1']);
    expect(groups[0]!.emergency).toBe(true);
    expect(groups[1]!.notices.map((n) => n.id)).toEqual(['c', 'a', 'b']);
  });

  it('counts who has been told, acknowledged and is silent, leaving withdrawn notices out', () => {
    const [g] = groupByOrder([
      notice({
        recipients: [
          recipient('told'),
          recipient('acknowledged'),
          recipient('silent'),
          recipient('silent'),
        ],
      }),
      notice({ id: 'x', recipients: [recipient('bounced'), recipient('waiting')] }),
      notice({ id: 'w', state: 'withdrawn', recipients: [recipient('waiting')] }),
    ]);
    expect(g!.counts).toEqual({ told: 1, acknowledged: 1, silent: 2, bounced: 1, waiting: 1 });
    expect(countsSentence(g!.counts)).toBe(
      '4 told · 1 acknowledged · 2 silent · 1 not yet told · 1 mail refused',
    );
  });
});
