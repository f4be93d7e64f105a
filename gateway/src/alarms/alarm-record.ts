import {
  displayState,
  NORMAL,
  type AlarmCondition,
  type AlarmEvent,
  type AlarmEventKind,
  type AlarmState,
  type AlarmView,
  type Handling,
  type Priority,
} from '@stillwell/shared/alarms';
import type { AlarmEventRow } from './alarm-event.entity';
import { AlarmRow } from './alarm.entity';

/** A plain copy of a row: the service keeps these in memory and writes them as rows. */
export type AlarmRecord = Omit<AlarmRow, never>;

export function newRecord(reservoirId: string, c: AlarmCondition, nowMs: number): AlarmRecord {
  return {
    reservoirId,
    conditionId: c.id,
    kind: c.kind,
    label: c.label,
    priority: c.priority,
    active: NORMAL.active,
    acknowledged: NORMAL.acknowledged,
    handling: NORMAL.handling,
    shelvedUntil: null,
    reason: null,
    handledBy: null,
    raisedAt: null,
    clearedAt: null,
    acknowledgedAt: null,
    acknowledgedBy: null,
    value: null,
    limitValue: c.limit,
    message: '',
    lastChange: nowMs,
    activations: 0,
  };
}

export function stateOf(r: AlarmRecord): AlarmState {
  return {
    active: r.active,
    acknowledged: r.acknowledged,
    handling: r.handling as Handling,
    shelvedUntilMs: r.shelvedUntil,
    reason: r.reason,
  };
}

/** The record with a new state; who shelved or removed it stays only while it is away. */
export function withState(r: AlarmRecord, s: AlarmState, nowMs: number): AlarmRecord {
  return {
    ...r,
    active: s.active,
    acknowledged: s.acknowledged,
    handling: s.handling,
    shelvedUntil: s.shelvedUntilMs,
    reason: s.reason,
    handledBy: s.handling === 'in-service' ? null : r.handledBy,
    lastChange: nowMs,
  };
}

export function toRow(r: AlarmRecord): AlarmRow {
  return Object.assign(new AlarmRow(), r);
}

export function toView(r: AlarmRecord, c: AlarmCondition | undefined): AlarmView {
  return {
    reservoirId: r.reservoirId,
    conditionId: r.conditionId,
    kind: (c?.kind ?? r.kind) as AlarmView['kind'],
    label: c?.label ?? r.label,
    priority: (c?.priority ?? r.priority) as Priority,
    source: c?.source ?? 'telemetry',
    state: displayState(stateOf(r)),
    active: r.active,
    acknowledged: r.acknowledged,
    handling: r.handling as Handling,
    shelvedUntilMs: r.shelvedUntil,
    reason: r.reason,
    handledBy: r.handledBy,
    raisedAtMs: r.raisedAt,
    clearedAtMs: r.clearedAt,
    acknowledgedAtMs: r.acknowledgedAt,
    acknowledgedBy: r.acknowledgedBy,
    value: r.value,
    limit: r.limitValue,
    unit: c?.unit ?? null,
    message: r.message,
    lastChangeMs: r.lastChange,
    activations: r.activations,
  };
}

export function toEvent(e: AlarmEventRow): AlarmEvent {
  return {
    id: e.id,
    reservoirId: e.reservoirId,
    conditionId: e.conditionId,
    kind: e.kind as AlarmEventKind,
    siteTimeMs: e.siteTime,
    priority: e.priority as Priority,
    annunciated: Boolean(e.annunciated),
    actor: e.actorName,
    text: e.text,
    value: e.value,
    logbookSeq: e.logbookSeq,
  };
}
