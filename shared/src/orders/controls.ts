import type { ReservoirDefinition } from '../reservoirs/definition.js';

/** A gate or valve an order can move, as the reservoir definition describes it. */
export interface OrderControl {
  /** gate id, or the low-level outlet's structure id for its valve */
  id: string;
  kind: 'gate' | 'valve';
  label: string;
  /** the telemetry channel reporting its position */
  channel: string;
  /** the field device that reports it and takes its commands */
  deviceId: string;
  /** largest opening: m for a gate, 100 % for a valve */
  max: number;
  unit: 'm' | '%';
  /** m/s for a gate, %/s for a valve */
  travelSpeed: number;
}

/**
 * How close a reported position must come to its target to count as reached. A gate encoder
 * reports to the millimetre and a valve to 0.1 %; the margins leave room for the last report
 * before the machinery stops.
 */
export const POSITION_TOLERANCE: Readonly<Record<OrderControl['kind'], number>> = {
  gate: 0.05,
  valve: 1,
};

/** Every gate and valve of a reservoir, in the order of its definition. */
export function controlsOf(definition: ReservoirDefinition): OrderControl[] {
  const deviceOf = (channel: string) =>
    definition.channels.find((c) => c.id === channel)?.deviceId ?? '';
  const list: OrderControl[] = [];
  for (const s of definition.structures) {
    if (s.kind === 'gated-spillway') {
      s.gates.forEach((g, i) =>
        list.push({
          id: g.id,
          kind: 'gate',
          label: `Gate ${i + 1} (${s.name})`,
          channel: g.channel,
          deviceId: deviceOf(g.channel),
          max: g.maxOpening,
          unit: 'm',
          travelSpeed: g.travelSpeed,
        }),
      );
    } else if (s.kind === 'low-level-outlet') {
      list.push({
        id: s.id,
        kind: 'valve',
        label: `${s.name} valve`,
        channel: s.valveChannel,
        deviceId: deviceOf(s.valveChannel),
        max: 100,
        unit: '%',
        travelSpeed: s.travelSpeed,
      });
    }
  }
  return list;
}

/** Seconds a control needs to travel between two openings at its speed. */
export function travelSeconds(control: OrderControl, from: number, to: number): number {
  return Math.abs(to - from) / control.travelSpeed;
}
