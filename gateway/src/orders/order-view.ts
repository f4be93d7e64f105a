import type {
  ForecastLink,
  Order,
  OrderCommand,
  OrderImpact,
  OrderStep,
  Person,
} from '@stillwell/shared/orders';
import type { OrderRow } from './order.entity';
import type { OrderCommandRow } from './order-command.entity';

/** What an order row keeps as JSON in `body`. */
export interface OrderBody {
  steps: OrderStep[];
  reason: string;
  plannedStart: string;
  author: Person;
  forecast: ForecastLink | null;
  impact: OrderImpact | null;
  decision: Order['decision'];
  execution: Order['execution'];
  fault: Order['fault'];
  countersign: Order['countersign'];
  withdrawal: Order['withdrawal'];
}

export const iso = (ms: number) => new Date(ms).toISOString();
const isoOrNull = (ms: number | null) => (ms === null ? null : iso(ms));

export function bodyOf(row: OrderRow): OrderBody {
  return JSON.parse(row.body) as OrderBody;
}

export function toCommand(c: OrderCommandRow): OrderCommand {
  return {
    commandId: c.commandId,
    step: c.step,
    deviceId: c.deviceId,
    targets: JSON.parse(c.targets) as Record<string, number>,
    from: JSON.parse(c.fromPositions) as Record<string, number>,
    state: c.state as OrderCommand['state'],
    sentAt: isoOrNull(c.sentAt),
    ackAt: isoOrNull(c.ackAt),
    reason: c.reason,
    confirmedAt: isoOrNull(c.confirmedAt),
  };
}

export function toOrder(row: OrderRow, commands: readonly OrderCommandRow[]): Order {
  const b = bodyOf(row);
  return {
    id: row.id,
    reservoirId: row.reservoirId,
    state: row.state as Order['state'],
    emergency: Boolean(row.emergency),
    emergencyId: row.emergencyId,
    steps: b.steps,
    reason: b.reason,
    plannedStart: b.plannedStart,
    author: b.author,
    createdAt: iso(row.createdAt),
    forecast: b.forecast,
    impact: b.impact,
    decision: b.decision,
    authorisedUntil: isoOrNull(row.authorisedUntil),
    execution: b.execution,
    currentStep: row.currentStep,
    nextStepDue: isoOrNull(row.nextStepDue),
    commands: [...commands]
      .sort((a, b2) => a.step - b2.step || a.deviceId.localeCompare(b2.deviceId))
      .map(toCommand),
    fault: b.fault,
    awaitingCountersign: Boolean(row.awaitingCountersign),
    countersign: b.countersign,
    withdrawal: b.withdrawal,
    updatedAt: iso(row.updatedAt),
  };
}

/** Every gate and valve an order names, for the logbook's gate filter. */
export function controlsOfSteps(steps: readonly OrderStep[]): string[] {
  return [...new Set(steps.flatMap((s) => s.targets.map((t) => t.control)))].sort();
}
