import type { Notice, Standing } from '@stillwell/shared/notices';

export interface OrderGroup {
  orderId: string;
  releaseM3s: number;
  emergency: boolean;
  notices: Notice[];
  counts: Record<Standing, number>;
}

const empty = (): Record<Standing, number> => ({
  waiting: 0,
  told: 0,
  acknowledged: 0,
  silent: 0,
  bounced: 0,
});

/**
 * The board by order: newest order first, its zones nearest the dam first, and how many people
 * stand where. Withdrawn notices go to the end of their order: nobody is waiting on them.
 */
export function groupByOrder(notices: readonly Notice[]): OrderGroup[] {
  const groups = new Map<string, OrderGroup>();
  for (const n of notices) {
    let g = groups.get(n.orderId);
    if (!g) {
      g = {
        orderId: n.orderId,
        releaseM3s: n.releaseM3s,
        emergency: n.emergency,
        notices: [],
        counts: empty(),
      };
      groups.set(n.orderId, g);
    }
    g.notices.push(n);
    g.emergency ||= n.emergency;
    if (n.state !== 'withdrawn') for (const r of n.recipients) g.counts[r.standing] += 1;
  }
  const latest = (g: OrderGroup) => Math.max(...g.notices.map((n) => n.preparedAt));
  return [...groups.values()]
    .map((g) => ({
      ...g,
      notices: [...g.notices].sort(
        (a, b) =>
          Number(a.state === 'withdrawn') - Number(b.state === 'withdrawn') ||
          a.distanceM - b.distanceM,
      ),
    }))
    .sort((a, b) => latest(b) - latest(a));
}

/** What the liaison calls each standing. */
export const STANDING_LABELS: Readonly<Record<Standing, string>> = {
  waiting: 'Not yet told',
  told: 'Told, awaiting word',
  acknowledged: 'Acknowledged',
  silent: 'Silent',
  bounced: 'Mail refused',
};

/** The sentence above an order's notices: who has been told, who has answered, who is silent. */
export function countsSentence(counts: Record<Standing, number>): string {
  const told = counts.told + counts.acknowledged + counts.silent;
  const parts = [`${told} told`, `${counts.acknowledged} acknowledged`, `${counts.silent} silent`];
  if (counts.waiting) parts.push(`${counts.waiting} not yet told`);
  if (counts.bounced) parts.push(`${counts.bounced} mail refused`);
  return parts.join(' · ');
}
