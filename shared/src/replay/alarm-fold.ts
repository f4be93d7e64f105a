import type { AlarmEvent } from '../alarms/api.js';
import { displayState, NORMAL, type AlarmState } from '../alarms/lifecycle.js';
import type { ReplayAlarmState } from './api.js';

type FoldEvent = Pick<
  AlarmEvent,
  'conditionId' | 'kind' | 'siteTimeMs' | 'priority' | 'text' | 'actor'
>;

function next(s: AlarmState, kind: AlarmEvent['kind']): AlarmState {
  switch (kind) {
    case 'raised':
      return { ...s, active: true, acknowledged: false };
    case 'cleared':
      return { ...s, active: false };
    case 'acknowledged':
      return { ...s, acknowledged: true };
    case 'shelved':
      return { ...s, handling: 'shelved' };
    case 'removed-from-service':
      return { ...s, handling: 'out-of-service' };
    case 'shelf-expired':
    case 'returned-to-service':
      return { ...s, handling: 'in-service' };
  }
}

/**
 * The alarms standing at `atMs`: the start states with every event up to and including `atMs`
 * applied in order (events sorted by time). Alarms back to normal are left out.
 */
export function alarmsAt(
  start: readonly ReplayAlarmState[],
  events: readonly FoldEvent[],
  atMs: number,
): ReplayAlarmState[] {
  const states = new Map<string, { s: AlarmState; view: ReplayAlarmState }>();
  for (const a of start) {
    states.set(a.conditionId, {
      s: { ...NORMAL, active: a.active, acknowledged: a.acknowledged, handling: handlingOf(a) },
      view: a,
    });
  }
  for (const e of events) {
    if (e.siteTimeMs > atMs) break;
    const before = states.get(e.conditionId)?.s ?? NORMAL;
    const s = next(before, e.kind);
    states.set(e.conditionId, {
      s,
      view: {
        conditionId: e.conditionId,
        priority: e.priority,
        state: displayState(s),
        active: s.active,
        acknowledged: s.acknowledged,
        sinceMs: e.siteTimeMs,
        text: e.text,
        actor: e.actor,
      },
    });
  }
  return [...states.values()].map((x) => x.view).filter((v) => v.state !== 'normal');
}

function handlingOf(a: ReplayAlarmState): AlarmState['handling'] {
  if (a.state === 'shelved') return 'shelved';
  if (a.state === 'out-of-service') return 'out-of-service';
  return 'in-service';
}
