#!/usr/bin/env node
import { parseCli, USAGE } from './cli-options.js';
import { startSimulation } from './simulation.js';

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
  const sim = await startSimulation({ ...parsed.options, log });
  log(`devices connected to ${sim.mqttUrl}; speed ${sim.speed}x; Ctrl-C stops`);

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
}

main().catch((error: unknown) => {
  // A RangeError is a mistake in the options: its message says enough.
  console.error(
    'stillwell-sim failed to start:',
    error instanceof RangeError ? error.message : error,
  );
  process.exit(1);
});
