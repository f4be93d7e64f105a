import { ackTopic, commandTopic } from '@stillwell/shared/telemetry';
import type { Actuator, ReservoirPlant } from '../plant/reservoir-plant.js';
import { checkCommand, CommandLedger, type CommandAck } from './commands.js';
import type { Outbox } from './telemetry-device.js';

export interface GateControllerOptions {
  reservoirId: string;
  deviceId: string;
  plant: ReservoirPlant;
  /** the gates and valves this controller drives */
  actuators: readonly Actuator[];
  /** where acks go */
  outbox: Outbox;
  log?: (line: string) => void;
}

/**
 * The command side of the gate controller (its positions are reported by its TelemetryDevice).
 * Each command is answered on the ack topic; a repeated commandId gets its first answer again and
 * changes nothing, so a gateway may retry safely.
 */
export class GateController {
  readonly commandTopic: string;
  readonly ackTopic: string;
  private readonly ledger = new CommandLedger();

  constructor(private readonly options: GateControllerOptions) {
    this.commandTopic = commandTopic(options.reservoirId, options.deviceId);
    this.ackTopic = ackTopic(options.reservoirId, options.deviceId);
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
      ack = { commandId: check.commandId, status: 'accepted', time };
    } else {
      ack = { commandId: check.commandId, status: 'rejected', reason: check.reason, time };
    }
    this.ledger.record(ack);
    outbox.publish(this.ackTopic, JSON.stringify(ack));
    log?.(`command ${ack.commandId} ${ack.status}: ${ack.reason ?? payload}`);
    return ack;
  }
}
