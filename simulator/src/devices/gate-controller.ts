import { randomUUID } from 'node:crypto';
import { ruleEventsTopic, rulesTopic } from '@stillwell/shared/orders';
import { ackTopic, commandTopic } from '@stillwell/shared/telemetry';
import type { Actuator, PlantState, ReservoirPlant } from '../plant/reservoir-plant.js';
import { AutomaticRules, type RuleEvent } from './automatic-rule.js';
import { checkCommand, CommandLedger, type CommandAck } from './commands.js';
import type { Outbox } from './telemetry-device.js';

export interface GateControllerOptions {
  reservoirId: string;
  deviceId: string;
  plant: ReservoirPlant;
  /** the gates and valves this controller drives */
  actuators: readonly Actuator[];
  /** where acks and rule events go */
  outbox: Outbox;
  log?: (line: string) => void;
  /** prefix of rule event ids; random per start by default, so ids stay unique across restarts */
  bootId?: string;
}

/**
 * The command side of the gate controller (its positions are reported by its TelemetryDevice).
 * Each command is answered on the ack topic; a repeated commandId gets its first answer again and
 * changes nothing, so a gateway (or a broker redelivering at QoS 1) may repeat it safely. It also
 * runs the automatic rules configured on its rules topic and reports what they do.
 */
export class GateController {
  readonly commandTopic: string;
  readonly ackTopic: string;
  readonly rulesTopic: string;
  readonly ruleEventsTopic: string;
  private readonly ledger = new CommandLedger();
  private readonly rules: AutomaticRules;
  private readonly bootId: string;
  private eventCount = 0;
  /** commands that set targets: a repeated one does not count again */
  commandsApplied = 0;

  constructor(private readonly options: GateControllerOptions) {
    this.commandTopic = commandTopic(options.reservoirId, options.deviceId);
    this.ackTopic = ackTopic(options.reservoirId, options.deviceId);
    this.rulesTopic = rulesTopic(options.reservoirId, options.deviceId);
    this.ruleEventsTopic = ruleEventsTopic(options.reservoirId, options.deviceId);
    this.bootId = options.bootId ?? randomUUID().slice(0, 8);
    this.rules = new AutomaticRules(options.actuators, (e) => this.report(e));
  }

  /** Handles one command payload; returns the ack sent, or null when there was nobody to answer. */
  handleCommand(payload: string): CommandAck | null {
    const { plant, outbox, log } = this.options;
    const check = checkCommand(payload, this.options.actuators);
    if (check.commandId === null) {
      log?.(
        `gate controller: ignored a command without a usable commandId: ${check.ok ? '' : check.reason}`,
      );
      return null;
    }
    const earlier = this.ledger.get(check.commandId);
    if (earlier) {
      outbox.publish(this.ackTopic, JSON.stringify(earlier));
      return earlier;
    }
    const time = new Date(plant.state.timeMs).toISOString();
    let ack: CommandAck;
    if (check.ok) {
      plant.setTargets(check.change);
      this.commandsApplied += 1;
      ack = { commandId: check.commandId, status: 'accepted', time };
    } else {
      ack = { commandId: check.commandId, status: 'rejected', reason: check.reason, time };
    }
    this.ledger.record(ack);
    outbox.publish(this.ackTopic, JSON.stringify(ack));
    log?.(`command ${ack.commandId} ${ack.status}: ${ack.reason ?? payload}`);
    return ack;
  }

  /** Takes a rule set from the rules topic (retained, so it arrives again at every connect). */
  handleRules(payload: string): boolean {
    return this.rules.apply(payload, this.options.plant.state.timeMs);
  }

  /** Called after every plant step: an automatic rule may move a gate. */
  onStep(state: Readonly<PlantState>): void {
    const change = this.rules.evaluate(state);
    if (change) this.options.plant.setTargets(change);
  }

  get ruleSet() {
    return this.rules.current;
  }

  private report(event: RuleEvent): void {
    this.eventCount += 1;
    const message = {
      eventId: `${this.options.deviceId}-${this.bootId}-${this.eventCount}`,
      ...event,
    };
    this.options.outbox.publish(this.ruleEventsTopic, JSON.stringify(message));
    this.options.log?.(
      `automatic rule ${event.kind}${event.control ? ` ${event.control}` : ''} (revision ${event.revision})${event.reason ? `: ${event.reason}` : ''}`,
    );
  }
}
