import { isTopicSegment } from '@stillwell/shared/telemetry';
import type { DeviceFault, FaultKind } from './scenario.js';

const WINDOW = /^([a-z0-9][a-z0-9-]{0,63}):(\d+(?:\.\d+)?)-(\d+(?:\.\d+)?)$/;

/** Reads "device:startHour-endHour" (as given on the command line); throws a RangeError when malformed. */
export function parseFault(kind: FaultKind, text: string): DeviceFault {
  const match = WINDOW.exec(text.trim());
  if (!match) {
    throw new RangeError(
      `--${kind} "${text}": expected device:startHour-endHour, e.g. pool-radar:20-23`,
    );
  }
  const [, deviceId = '', start = '', end = ''] = match;
  const fault: DeviceFault = { kind, deviceId, startHour: Number(start), endHour: Number(end) };
  checkFault(fault);
  return fault;
}

export function checkFault(fault: DeviceFault): void {
  if (!isTopicSegment(fault.deviceId)) {
    throw new RangeError(`${fault.kind}: "${fault.deviceId}" is not a device id`);
  }
  if (!(fault.startHour >= 0 && fault.endHour > fault.startHour)) {
    throw new RangeError(
      `${fault.kind} for ${fault.deviceId}: the window must start at 0 h or later and end after it starts`,
    );
  }
}

/** The fault affecting a device at `hour`, if any; a drop-out wins over a freeze when both apply. */
export function activeFault(
  faults: readonly DeviceFault[],
  deviceId: string,
  hour: number,
): FaultKind | null {
  let found: FaultKind | null = null;
  for (const f of faults) {
    if (f.deviceId !== deviceId || hour < f.startHour || hour >= f.endHour) continue;
    if (f.kind === 'dropout') return 'dropout';
    found = f.kind;
  }
  return found;
}
