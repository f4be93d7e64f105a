import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { describe, expect, it } from 'vitest';
import { ReservoirPlant } from '../plant/reservoir-plant.js';
import { DEMO_STORM } from '../scenarios/demo-storm.js';
import { checkCommand, type CommandAck } from './commands.js';
import { GateController } from './gate-controller.js';

const START = Date.UTC(2030, 0, 1);

function setup() {
  const plant = new ReservoirPlant({
    reservoir: DEMO_RESERVOIR,
    scenario: DEMO_STORM,
    startMs: START,
  });
  const sent: Array<{ topic: string; ack: CommandAck }> = [];
  const outbox = {
    publish(topic: string, payload: string) {
      sent.push({ topic, ack: JSON.parse(payload) as CommandAck });
      return true;
    },
  };
  const controller = new GateController({
    reservoirId: 'lake-orrin',
    deviceId: 'gate-controller',
    plant,
    actuators: plant.actuators,
    outbox,
  });
  const send = (body: unknown) => controller.handleCommand(JSON.stringify(body));
  return { plant, sent, controller, send };
}

describe('checkCommand', () => {
  const { actuators } = setup().plant;

  it('accepts gates in metres and valves in percent', () => {
    const check = checkCommand(
      JSON.stringify({
        commandId: 'c1',
        gates: { 'gate-2': 4.5 },
        valves: { 'low-level-outlet': 40 },
      }),
      actuators,
    );
    expect(check).toEqual({
      ok: true,
      commandId: 'c1',
      change: { gates: { 'gate-2': 4.5 }, valves: { 'low-level-outlet': 40 } },
    });
  });

  it.each([
    [{ commandId: 'c', gates: { 'gate-1': 9.01 } }, /gate "gate-1".*outside 0\.\.9 m/],
    [{ commandId: 'c', gates: { 'gate-1': -0.1 } }, /outside 0\.\.9 m/],
    [{ commandId: 'c', valves: { 'low-level-outlet': 101 } }, /outside 0\.\.100 %/],
    [{ commandId: 'c', gates: { 'gate-9': 1 } }, /no gate "gate-9"/],
    [{ commandId: 'c', valves: { 'gate-1': 1 } }, /no valve "gate-1"/],
    [{ commandId: 'c', gates: { 'gate-1': '3' } }, /must be a number/],
    [{ commandId: 'c', gates: [1] }, /gates must be an object/],
    [{ commandId: 'c' }, /names no gate or valve/],
    [{ commandId: 'c', gate: { 'gate-1': 1 } }, /unknown field/],
  ])('rejects %j with a reason', (body, reason) => {
    const check = checkCommand(JSON.stringify(body), actuators);
    expect(check.ok).toBe(false);
    expect(check.commandId).toBe('c');
    if (!check.ok) expect(check.reason).toMatch(reason);
  });

  it('has no commandId to answer for unreadable payloads', () => {
    expect(checkCommand('{nope', actuators)).toMatchObject({ ok: false, commandId: null });
    expect(checkCommand('{"gates":{}}', actuators)).toMatchObject({ ok: false, commandId: null });
    expect(checkCommand('[]', actuators)).toMatchObject({ ok: false, commandId: null });
  });
});

describe('GateController commands', () => {
  it('acknowledges an accepted command on its ack topic at plant time and sets the target', () => {
    const { plant, sent, send } = setup();
    const ack = send({ commandId: 'open-1', gates: { 'gate-1': 3 } });
    expect(ack).toEqual({
      commandId: 'open-1',
      status: 'accepted',
      time: new Date(START).toISOString(),
    });
    expect(sent).toEqual([{ topic: 'stillwell/v1/lake-orrin/ack/gate-controller', ack }]);
    expect(plant.targetSettings.gates['gate-1']).toBe(3);
  });

  it('is idempotent: a repeated commandId gets the first answer and moves nothing', () => {
    const { plant, sent, send } = setup();
    const first = send({ commandId: 'open-1', gates: { 'gate-1': 3 } });
    send({ commandId: 'close-1', gates: { 'gate-1': 0 } });
    plant.step(10);
    const again = send({ commandId: 'open-1', gates: { 'gate-1': 3 } });
    expect(again).toEqual(first);
    expect(sent).toHaveLength(3);
    expect(sent[2]?.ack).toEqual(first);
    expect(plant.targetSettings.gates['gate-1']).toBe(0);
  });

  it('rejects a whole command when one target is out of range, and remembers the rejection', () => {
    const { plant, send } = setup();
    const ack = send({ commandId: 'bad', gates: { 'gate-1': 2, 'gate-2': 12 } });
    expect(ack).toMatchObject({ commandId: 'bad', status: 'rejected' });
    expect(ack?.reason).toMatch(/gate-2/);
    expect(plant.targetSettings.gates['gate-1']).toBe(0);
    expect(send({ commandId: 'bad', gates: { 'gate-1': 2 } })).toEqual(ack);
    expect(plant.targetSettings.gates['gate-1']).toBe(0);
  });

  it('sends nothing when there is no commandId to answer', () => {
    const { sent, controller } = setup();
    expect(controller.handleCommand('not json')).toBeNull();
    expect(sent).toHaveLength(0);
  });
});
