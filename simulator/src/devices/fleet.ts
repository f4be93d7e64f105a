import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { PlantState, ReservoirPlant } from '../plant/reservoir-plant.js';
import { createRandom, deriveSeed } from '../plant/rng.js';
import type { DeviceFault } from '../scenarios/scenario.js';
import { channelReaders, type ChannelReader } from './channels.js';
import { GateController } from './gate-controller.js';
import { deviceClientId } from '../broker/accounts.js';
import { DeviceLink } from './link.js';
import { TelemetryDevice, type DeviceStats } from './telemetry-device.js';

export interface FleetOptions {
  reservoir: ReservoirDefinition;
  plant: ReservoirPlant;
  mqttUrl: string;
  seed: number;
  faults: readonly DeviceFault[];
  /** plant time at the start, epoch ms */
  startMs: number;
  log?: (line: string) => void;
  /** each device's broker account, by device id */
  credentialsFor?: (deviceId: string) => { username: string; password: string };
}

/** While a gate or valve moves, its position is reported this often, plant seconds. */
const MOVING_REPORT_S = 10;

/** Every field device of the reservoir, each on its own MQTT connection as in the field. */
export class DeviceFleet {
  private constructor(
    private readonly devices: readonly TelemetryDevice[],
    private readonly links: readonly DeviceLink[],
    readonly controllers: readonly GateController[],
  ) {}

  static async connect(options: FleetOptions): Promise<DeviceFleet> {
    const { reservoir, plant, seed, faults, startMs } = options;
    const byDevice = new Map<string, ChannelReader[]>();
    for (const reader of channelReaders(reservoir)) {
      const list = byDevice.get(reader.channel.deviceId) ?? [];
      list.push(reader);
      byDevice.set(reader.channel.deviceId, list);
    }
    const ids = [...byDevice.keys()];
    const settled = await Promise.allSettled(
      ids.map((id) =>
        DeviceLink.connect(options.mqttUrl, deviceClientId(id), options.credentialsFor?.(id)),
      ),
    );
    const links = settled.flatMap((r) => (r.status === 'fulfilled' ? [r.value] : []));
    const failed = settled.find((r) => r.status === 'rejected');
    if (failed) {
      await Promise.allSettled(links.map((l) => l.close()));
      throw failed.reason;
    }
    const devices: TelemetryDevice[] = [];
    const controllers: GateController[] = [];
    try {
      for (const [i, deviceId] of ids.entries()) {
        const link = links[i];
        const readers = byDevice.get(deviceId);
        if (!link || !readers) continue;
        const channels = new Set(readers.map((r) => r.channel.id));
        const actuators = plant.actuators.filter((a) => channels.has(a.channel));
        const ctx = {
          reservoirId: reservoir.id,
          faults,
          startMs,
          hourAt: (ms: number) => plant.hourAt(ms),
          // Only devices that drive something report their positions while they move.
          reportChangesAfterS: actuators.length ? MOVING_REPORT_S : undefined,
        };
        const random = createRandom(deriveSeed(seed, deviceId));
        const device = new TelemetryDevice(deviceId, readers, link, ctx, random);
        devices.push(device);
        await link.subscribe(device.backfillTopic, (payload) => device.handleBackfill(payload));
        link.onConnect(() => device.pump());
        if (actuators.length) {
          const controller = new GateController({
            reservoirId: reservoir.id,
            deviceId,
            plant,
            actuators,
            outbox: link,
            log: options.log,
          });
          await link.subscribe(controller.commandTopic, (payload) =>
            controller.handleCommand(payload),
          );
          await link.subscribe(controller.rulesTopic, (payload) => controller.handleRules(payload));
          controllers.push(controller);
        }
      }
    } catch (error) {
      await Promise.allSettled(links.map((l) => l.close()));
      throw error;
    }
    return new DeviceFleet(devices, links, controllers);
  }

  onStep(state: Readonly<PlantState>): void {
    // rules first: a gate an automatic rule starts is reported moving from this step on
    for (const c of this.controllers) c.onStep(state);
    for (const d of this.devices) d.onStep(state);
  }

  /** Sends what waits in every device's buffer (while the plant stands still, nothing else does). */
  pump(): void {
    for (const d of this.devices) d.pump();
  }

  /** Nothing waits in any device's buffer. */
  get idle(): boolean {
    return this.devices.every((d) => d.idle);
  }

  stats(): DeviceStats[] {
    return this.devices.map((d) => d.stats());
  }

  get congested(): boolean {
    return this.links.some((l) => l.congested);
  }

  /** Resolves when the broker has acknowledged everything published so far. */
  async flush(): Promise<void> {
    await Promise.all(this.links.map((l) => l.flush()));
  }

  async close(): Promise<void> {
    await Promise.all(this.links.map((l) => l.close()));
  }
}
