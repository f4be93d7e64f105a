import { clockTopic, type SiteClockMessage } from '@stillwell/shared/telemetry';
import { DEMO_RESERVOIR, type ReservoirDefinition } from '@stillwell/shared/reservoirs';
import {
  brokerAccounts,
  CLOCK_CLIENT_ID,
  clockCredentials,
  deviceCredentials,
  type SimulatorCredentials,
} from './broker/accounts.js';
import { aclPolicy } from './broker/acl.js';
import { startBroker, type BrokerPolicy, type RunningBroker } from './broker/broker.js';
import { DeviceFleet } from './devices/fleet.js';
import { DeviceLink } from './devices/link.js';
import type { DeviceStats } from './devices/telemetry-device.js';
import { floorToMinute, PlantClock } from './plant/clock.js';
import { ReservoirPlant } from './plant/reservoir-plant.js';
import { PlantRunner } from './plant/runner.js';
import { checkFault } from './scenarios/faults.js';
import { findScenario } from './scenarios/index.js';
import type { DeviceFault, Leak, Scenario } from './scenarios/scenario.js';
import { describeState } from './status-line.js';

export interface SimulationOptions {
  /** plant seconds per wall second (default 360: the 72-hour storm in 12 minutes) */
  speed?: number;
  /** start a broker (default true); false: connect to `mqttUrl` */
  broker?: boolean;
  /** port of the started broker (default: the port of `mqttUrl`, 1883; 0 picks a free one) */
  brokerPort?: number;
  brokerHost?: string;
  brokerPolicy?: BrokerPolicy;
  /**
   * Broker accounts: the devices and clock connect with theirs, and a broker started here lets in
   * only these accounts, each to its own topics (broker/acl.ts). Without them a started broker is
   * open (in-process tests); the command line always passes them.
   */
  credentials?: SimulatorCredentials;
  /** the broker the devices use (default mqtt://127.0.0.1:1883); a started broker replaces it */
  mqttUrl?: string;
  /** a scenario id or definition (default 'demo-storm') */
  scenario?: string | Scenario;
  /** faults added to the scenario's own */
  faults?: readonly DeviceFault[];
  /** a hidden abutment leak, replacing the scenario's own (if any) */
  leak?: Leak;
  seed?: number;
  reservoir?: ReservoirDefinition;
  /** plant time at the start (default: now, rounded down to the minute) */
  startTime?: Date;
  /** plant seconds per model step (default 10) */
  stepS?: number;
  /**
   * true (default): the plant runs on its own against the wall clock. false: it stands still until
   * advance() is called, which tests and benchmarks use to stay independent of timing.
   */
  realtime?: boolean;
  log?: (line: string) => void;
}

export interface Simulation {
  /** port of the started broker; null with `broker: false` */
  brokerPort: number | null;
  /** the URL the devices connected to */
  mqttUrl: string;
  reservoirId: string;
  speed: number;
  plant: ReservoirPlant;
  /** steps the plant forward by this many plant seconds now, publishing as it goes */
  advance(plantSeconds: number): void;
  /** resolves when the broker has acknowledged every message published so far */
  flush(): Promise<void>;
  /**
   * Stops the plant where it stands, keeping every device connected: they send what waits in their
   * buffers and go on answering backfill requests. Resolves once nothing waits (or after `waitMs`),
   * with what each device produced: the ledger a fault test counts against.
   */
  hold(waitMs?: number): Promise<SimulationStats>;
  /** what each device has produced so far */
  stats(): SimulationStats;
  /** closes the devices, then the broker */
  stop(): Promise<void>;
}

export interface SimulationStats {
  /** plant time, ISO 8601 */
  plantTime: string;
  held: boolean;
  /** every device's buffer is empty and the broker has acknowledged all it was sent */
  idle: boolean;
  devices: DeviceStats[];
}

export async function startSimulation(options: SimulationOptions = {}): Promise<Simulation> {
  const speed = options.speed ?? 360;
  if (!(speed > 0 && speed <= 100_000))
    throw new RangeError(`speed must be in (0, 100000], got ${speed}`);
  const reservoir = options.reservoir ?? DEMO_RESERVOIR;
  const base =
    typeof options.scenario === 'object'
      ? options.scenario
      : findScenario(options.scenario ?? 'demo-storm');
  const scenario: Scenario = {
    ...base,
    faults: [...base.faults, ...(options.faults ?? [])],
    leak: options.leak ?? base.leak,
  };
  const deviceIds = new Set(reservoir.channels.map((c) => c.deviceId));
  for (const fault of scenario.faults) {
    checkFault(fault);
    // A misspelt device would otherwise make a drill that silently does nothing.
    if (!deviceIds.has(fault.deviceId)) {
      throw new RangeError(
        `${fault.kind}: no device "${fault.deviceId}"; known: ${[...deviceIds].join(', ')}`,
      );
    }
  }
  const log = options.log ?? (() => {});
  const startMs = floorToMinute(options.startTime?.getTime() ?? Date.now());
  const plant = new ReservoirPlant({ reservoir, scenario, startMs });

  let broker: RunningBroker | null = null;
  let mqttUrl = options.mqttUrl ?? 'mqtt://127.0.0.1:1883';
  if (options.broker ?? true) {
    // Without an explicit port the broker takes the one the devices were told to use.
    const urlPort = Number(new URL(mqttUrl).port || 1883);
    const { credentials } = options;
    const policy =
      options.brokerPolicy ??
      (credentials
        ? aclPolicy(brokerAccounts(credentials, reservoir.id, [...deviceIds]), log)
        : undefined);
    if (!policy) log('broker is open: no credentials given (any client may publish anything)');
    broker = await startBroker({
      port: options.brokerPort ?? urlPort,
      host: options.brokerHost,
      policy,
    });
    mqttUrl = `mqtt://${broker.host}:${broker.port}`;
    log(`broker listening on ${mqttUrl}`);
  }

  let fleet: DeviceFleet | undefined;
  let clockLink: DeviceLink | undefined;
  try {
    fleet = await DeviceFleet.connect({
      reservoir,
      plant,
      mqttUrl,
      seed: options.seed ?? 1,
      faults: scenario.faults,
      startMs,
      log,
      credentialsFor: options.credentials
        ? (id) => deviceCredentials(options.credentials!, reservoir.id, id)
        : undefined,
    });
    clockLink = await DeviceLink.connect(
      mqttUrl,
      CLOCK_CLIENT_ID,
      options.credentials ? clockCredentials(options.credentials, reservoir.id) : undefined,
    );
  } catch (error) {
    await fleet?.close();
    await broker?.close();
    throw error;
  }
  const devices = fleet;
  const clockOut = clockLink;

  const topic = clockTopic(reservoir.id);
  const publishClock = () => {
    const message: SiteClockMessage = {
      siteTime: new Date(plant.state.timeMs).toISOString(),
      speed,
    };
    clockOut.publish(topic, JSON.stringify(message), true);
  };
  let slippedS = 0;
  // Anchored once everything is connected, so the plant does not start with a backlog.
  const clock = new PlantClock(startMs, speed, Date.now());
  const runner = new PlantRunner({
    plant,
    clock,
    stepS: options.stepS ?? 10,
    onStep: (state) => devices.onStep(state),
    canStep: () => !devices.congested,
    onSlip: (lostS) => (slippedS += lostS),
  });

  devices.onStep(plant.state);
  publishClock();
  const timers: NodeJS.Timeout[] = [];
  if (options.realtime ?? true) {
    runner.start();
    timers.push(setInterval(publishClock, 1000));
    timers.push(
      setInterval(() => {
        log(describeState(plant, slippedS));
        slippedS = 0;
      }, 60_000),
    );
  }
  log(`${scenario.name}: ${describeState(plant, 0)}`);
  if (scenario.leak) {
    const { abutment, startHour, peakFlow } = scenario.leak;
    log(
      `drill: a hidden leak opens at the ${abutment} abutment at hour ${startHour}, growing to about ${peakFlow} m3/s`,
    );
  }

  let stopping: Promise<void> | undefined;
  let held = false;
  const stats = (idle: boolean): SimulationStats => ({
    plantTime: new Date(plant.state.timeMs).toISOString(),
    held,
    idle,
    devices: devices.stats(),
  });
  return {
    brokerPort: broker?.port ?? null,
    mqttUrl,
    reservoirId: reservoir.id,
    speed,
    plant,
    advance(plantSeconds: number) {
      runner.advanceTo(plant.state.timeMs + plantSeconds * 1000);
      publishClock();
    },
    async flush() {
      await Promise.all([devices.flush(), clockOut.flush()]);
    },
    async hold(waitMs = 30_000) {
      if (!held) {
        held = true;
        runner.stop();
        // with the plant still, nothing else pumps: a congested or reconnected link is retried here
        timers.push(setInterval(() => devices.pump(), 250));
      }
      const until = Date.now() + waitMs;
      while (!devices.idle && Date.now() < until) {
        devices.pump();
        await new Promise((r) => setTimeout(r, 100));
      }
      // a link that is down may never hear back: do not wait past the deadline for it
      let timer: NodeJS.Timeout | undefined;
      const late = new Promise<void>(
        (r) => (timer = setTimeout(r, Math.max(0, until - Date.now()))),
      );
      await Promise.race([devices.flush(), late]);
      clearTimeout(timer);
      return stats(devices.idle);
    },
    stats: () => stats(devices.idle),
    stop() {
      stopping ??= (async () => {
        runner.stop();
        timers.forEach(clearInterval);
        await Promise.allSettled([devices.close(), clockOut.close()]);
        await broker?.close();
      })();
      return stopping;
    },
  };
}
