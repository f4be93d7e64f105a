import { countAlarms, type AlarmList, type AlarmView } from '@stillwell/shared/alarms';
import { definition, SITE_NOW } from './fixtures';

/** An alarm as the gateway lists it; active and unacknowledged unless told otherwise. */
export function makeAlarm(conditionId: string, overrides: Partial<AlarmView> = {}): AlarmView {
  return {
    reservoirId: definition.id,
    conditionId,
    kind: 'pool-high',
    label: `Alarm ${conditionId}`,
    priority: 'advisory',
    source: 'telemetry',
    state: 'unacknowledged',
    active: true,
    acknowledged: false,
    handling: 'in-service',
    shelvedUntilMs: null,
    reason: null,
    handledBy: null,
    raisedAtMs: SITE_NOW - 60_000,
    clearedAtMs: null,
    acknowledgedAtMs: null,
    acknowledgedBy: null,
    value: 205.62,
    limit: 205.5,
    unit: 'm',
    message: 'pool 205.62 m (pool.radar); Watch level 205.50 m',
    lastChangeMs: SITE_NOW - 60_000,
    activations: 1,
    ...overrides,
  };
}

export function makeAlarmList(alarms: AlarmView[]): AlarmList {
  return { reservoirId: definition.id, siteNowMs: SITE_NOW, alarms, counts: countAlarms(alarms) };
}
