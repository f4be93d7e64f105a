// Runs several child processes as one tree: if one stops, the rest are stopped; Ctrl-C stops all.
import { spawn } from 'node:child_process';

export function runTree(specs, env = process.env) {
  const children = [];
  let stopping = false;

  const stop = (code = 0) => {
    if (stopping) return;
    stopping = true;
    let left = children.filter((c) => c.exitCode === null && c.signalCode === null);
    if (!left.length) process.exit(code);
    const timer = setTimeout(() => left.forEach((c) => c.kill('SIGKILL')), 10_000);
    for (const c of left) {
      c.once('exit', () => {
        left = left.filter((x) => x !== c);
        if (!left.length) {
          clearTimeout(timer);
          process.exit(code);
        }
      });
      c.kill('SIGTERM');
    }
  };

  process.on('SIGINT', () => stop(0));
  process.on('SIGTERM', () => stop(0));

  for (const { name, command = process.execPath, args } of specs) {
    const child = spawn(command, args, { env, stdio: 'inherit' });
    child.on('exit', (code, signal) => {
      if (stopping) return;
      console.error(
        `[stillwell] ${name} stopped (${signal ?? `exit ${code}`}); stopping the rest.`,
      );
      stop(code || 1);
    });
    children.push(child);
  }
}
