import type { Actuator, Settings } from '../plant/reservoir-plant.js';

/** What the gate controller accepts on its command topic. */
export interface GateCommand {
  commandId: string;
  gates?: Record<string, number>;
  valves?: Record<string, number>;
}

export interface CommandAck {
  commandId: string;
  status: 'accepted' | 'rejected';
  reason?: string;
  /** plant time the controller decided, ISO UTC */
  time: string;
}

export type CommandCheck =
  | { ok: true; commandId: string; change: Settings }
  | { ok: false; commandId: string | null; reason: string };

const MAX_ID_LENGTH = 128;

const isRecord = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * Checks a command payload completely; never throws. A command is all or nothing: one bad target
 * rejects the whole command, so an order is never half carried out.
 */
export function checkCommand(payload: string, actuators: readonly Actuator[]): CommandCheck {
  let json: unknown;
  try {
    json = JSON.parse(payload);
  } catch {
    return { ok: false, commandId: null, reason: 'payload is not JSON' };
  }
  if (!isRecord(json))
    return { ok: false, commandId: null, reason: 'command must be a JSON object' };
  const { commandId } = json;
  if (typeof commandId !== 'string' || commandId.length === 0 || commandId.length > MAX_ID_LENGTH) {
    return {
      ok: false,
      commandId: null,
      reason: `commandId must be a string of 1-${MAX_ID_LENGTH} characters`,
    };
  }
  const fail = (reason: string): CommandCheck => ({ ok: false, commandId, reason });
  const unknownKeys = Object.keys(json).filter(
    (k) => !['commandId', 'gates', 'valves'].includes(k),
  );
  if (unknownKeys.length) return fail(`unknown field(s): ${unknownKeys.join(', ')}`);

  const change: Settings = { gates: {}, valves: {} };
  for (const kind of ['gate', 'valve'] as const) {
    const field = kind === 'gate' ? 'gates' : 'valves';
    const given = json[field];
    if (given === undefined) continue;
    if (!isRecord(given)) return fail(`${field} must be an object of ${kind} id to opening`);
    for (const [id, value] of Object.entries(given)) {
      const actuator = actuators.find((a) => a.kind === kind && a.id === id);
      if (!actuator) return fail(`no ${kind} "${id}"`);
      const unit = kind === 'gate' ? 'm' : '%';
      if (typeof value !== 'number' || !Number.isFinite(value)) {
        return fail(`${kind} "${id}": opening must be a number (${unit})`);
      }
      if (value < 0 || value > actuator.max) {
        return fail(
          `${kind} "${id}": opening ${value} ${unit} is outside 0..${actuator.max} ${unit}`,
        );
      }
      change[field][id] = value;
    }
  }
  if (Object.keys(change.gates).length + Object.keys(change.valves).length === 0) {
    return fail('command names no gate or valve');
  }
  return { ok: true, commandId, change };
}

/**
 * The answers already given, by commandId, so that a repeated command (a retry after a lost ack)
 * gets the same answer and moves nothing. Bounded: the oldest answers are forgotten first.
 */
export class CommandLedger {
  private readonly answers = new Map<string, CommandAck>();

  constructor(private readonly capacity = 10_000) {}

  get(commandId: string): CommandAck | undefined {
    return this.answers.get(commandId);
  }

  record(ack: CommandAck): void {
    this.answers.set(ack.commandId, ack);
    if (this.answers.size > this.capacity) {
      const oldest = this.answers.keys().next().value;
      if (oldest !== undefined) this.answers.delete(oldest);
    }
  }
}
