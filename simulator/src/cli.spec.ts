import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const CLI = fileURLToPath(new URL('./cli.ts', import.meta.url));

/** Runs the CLI from source with tsx; `onLine` may send signals. Resolves with the exit code and output. */
function runCli(
  args: string[],
  onLine?: (line: string, kill: (s: NodeJS.Signals) => void) => void,
) {
  const child = spawn(process.execPath, ['--import', 'tsx', CLI, ...args], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout.setEncoding('utf8').on('data', (chunk: string) => {
    out += chunk;
    for (const line of chunk.split('\n')) if (line) onLine?.(line, (s) => child.kill(s));
  });
  child.stderr.setEncoding('utf8').on('data', (chunk: string) => (out += chunk));
  return new Promise<{ code: number | null; out: string }>((resolve) =>
    child.on('exit', (code) => resolve({ code, out })),
  );
}

describe('cli', () => {
  it('starts broker and plant, and on SIGTERM closes devices then broker, exiting 0', async () => {
    const { code, out } = await runCli(['--broker-port', '0', '--speed', '600'], (line, kill) => {
      if (line.includes('Ctrl-C stops')) kill('SIGTERM');
    });
    expect(out).toMatch(/broker listening on mqtt:\/\/127\.0\.0\.1:\d+/);
    expect(out).toMatch(/pool 204\.50 m, inflow 30 m3\/s/);
    expect(out).toMatch(/SIGTERM: closing devices, then the broker[\s\S]*stopped/);
    expect(code).toBe(0);
  });

  it('prints its usage for --help and refuses unknown options with exit code 2', async () => {
    const help = await runCli(['--help']);
    expect(help.code).toBe(0);
    expect(help.out).toMatch(/--dropout DEV:H1-H2/);
    const bad = await runCli(['--speed', 'fast']);
    expect(bad.code).toBe(2);
    expect(bad.out).toMatch(/--speed "fast" is not valid/);
  });
});
