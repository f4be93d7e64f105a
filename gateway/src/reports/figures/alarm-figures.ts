import { median, type AlarmFigure } from '@stillwell/shared/reports';

export interface AlarmEventFacts {
  conditionId: string;
  kind: string;
  t: number;
  id: number;
}

export interface AlarmLabel {
  label: string;
  priority: string;
}

/**
 * Per condition: raises in the window, and for each the time to the first acknowledgement after
 * it (before the next raise). Events must include those of the window only; an acknowledgement
 * after the window's end is not seen, so that raise counts as unacknowledged.
 */
export function alarmFigures(
  events: readonly AlarmEventFacts[],
  labels: ReadonlyMap<string, AlarmLabel>,
): {
  raised: number;
  acknowledged: number;
  medianToAck: number | null;
  byCondition: AlarmFigure[];
} {
  const byCondition = new Map<string, AlarmEventFacts[]>();
  for (const e of [...events].sort((a, b) => a.t - b.t || a.id - b.id)) {
    const list = byCondition.get(e.conditionId) ?? [];
    list.push(e);
    byCondition.set(e.conditionId, list);
  }
  const figures: AlarmFigure[] = [];
  for (const [conditionId, list] of byCondition) {
    let raised = 0;
    const timesToAck: number[] = [];
    let open: number | null = null;
    for (const e of list) {
      if (e.kind === 'raised') {
        raised += 1;
        open = e.t;
      } else if (e.kind === 'acknowledged' && open !== null) {
        timesToAck.push(e.t - open);
        open = null;
      }
    }
    if (!raised) continue;
    const label = labels.get(conditionId);
    figures.push({
      conditionId,
      label: label?.label ?? conditionId,
      priority: label?.priority ?? 'unknown',
      raised,
      acknowledged: timesToAck.length,
      timesToAck,
      medianToAck: median(timesToAck),
      maxToAck: timesToAck.length ? Math.max(...timesToAck) : null,
    });
  }
  figures.sort((a, b) => b.raised - a.raised || a.conditionId.localeCompare(b.conditionId));
  const all = figures.flatMap((f) => f.timesToAck);
  return {
    raised: figures.reduce((s, f) => s + f.raised, 0),
    acknowledged: all.length,
    medianToAck: median(all),
    byCondition: figures,
  };
}
