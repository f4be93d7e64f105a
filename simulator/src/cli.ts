#!/usr/bin/env node
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { brokerAccounts } from './broker/accounts.js';
import { ACL_RULES } from './broker/acl.js';
import { parseCli, USAGE } from './cli-options.js';
import { startSimulation, type SimulationStats } from './simulation.js';
import { writeStats } from './stats-file.js';

const log = (line: string) =>
  console.log(`[sim ${new Date().toISOString().slice(11, 19)}] ${line}`);

async function main(): Promise<void> {
  let parsed;
  try {
    parsed = parseCli(process.argv.slice(2), process.env);
  } catch (error) {
    console.error(`${(error as Error).message}\n\n${USAGE}`);
    process.exitCode = 2;
    return;
  }
  if (parsed.help) {
    process.stdout.write(USAGE);
    return;
  }
  const credentials = parsed.options.credentials!;
  if (parsed.printAccounts) {
    const devices = [...new Set(DEMO_RESERVOIR.channels.map((c) => c.deviceId))];
    for (const a of brokerAccounts(credentials, DEMO_RESERVOIR.id, devices)) {
      const rules = ACL_RULES[a.kind];
      console.log(
        `${a.kind}\t${a.username}\t${a.password}\tpublish ${rules.publish.join(' ')}\tsubscribe ${rules.subscribe.join(' ') || '-'}`,
      );
    }
    return;
  }
  if (parsed.demoCredentials) {
    log(
      'broker accounts: demo values (set SIM_GATEWAY_PASSWORD and SIM_DEVICE_SECRET for your own)',
    );
  }
  const sim = await startSimulation({ ...parsed.options, log });

  const { statsFile } = parsed;
  const record = (stats: SimulationStats) => {
    if (statsFile) writeStats(statsFile, stats);
  };
  if (statsFile) {
    process.on('SIGUSR2', () => {
      sim.hold().then(
        (stats) => {
          record(stats);
          const produced = stats.devices.reduce((n, d) => n + d.lastSeq + 1, 0);
          log(
            `held at plant ${stats.plantTime}: ${produced} readings produced; stats in ${statsFile}`,
          );
        },
        (error: unknown) => console.error('hold failed:', error),
      );
    });
  }

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) {
      log(`${signal} again: exiting at once`);
      process.exit(1);
    }
    stopping = true;
    log(`${signal}: closing devices, then the broker`);
    sim.stop().then(
      () => {
        record(sim.stats());
        log('stopped');
        process.exitCode = 0;
      },
      (error: unknown) => {
        console.error('stop failed:', error);
        process.exit(1);
      },
    );
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  // only once the handlers stand: a launcher may signal as soon as it reads this line
  log(`devices connected to ${sim.mqttUrl}; speed ${sim.speed}x; Ctrl-C stops`);
}

main().catch((error: unknown) => {
  // A RangeError is a mistake in the options: its message says enough.
  console.error(
    'stillwell-sim failed to start:',
    error instanceof RangeError ? error.message : error,
  );
  process.exit(1);
});
