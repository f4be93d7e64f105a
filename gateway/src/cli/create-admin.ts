#!/usr/bin/env node
import 'reflect-metadata';
import { createInterface } from 'node:readline';
import { Writable } from 'node:stream';
import { parseArgs } from 'node:util';
import { createAdmin } from './create-admin-command';

const USAGE = `Creates the first administrator (outside demo mode; refused once any administrator exists).

  node gateway/dist/cli/create-admin.js --username NAME [--display-name "Full Name"]

The password is read from standard input (one line), or asked for twice when it is a terminal.
At least 15 characters; not a common password. The same DATABASE_PATH as the gateway.
`;

async function readPiped(): Promise<string> {
  let text = '';
  for await (const chunk of process.stdin) text += String(chunk);
  return text.split(/\r?\n/)[0] ?? '';
}

/** Asks without echoing what is typed. */
async function ask(question: string): Promise<string> {
  let muted = false;
  const output = new Writable({
    write(chunk: Buffer, _enc, done) {
      if (!muted) process.stdout.write(chunk);
      done();
    },
  });
  const rl = createInterface({ input: process.stdin, output, terminal: true });
  try {
    return await new Promise<string>((resolve) => {
      rl.question(question, (answer) => resolve(answer));
      muted = true;
    });
  } finally {
    rl.close();
    process.stdout.write('\n');
  }
}

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      username: { type: 'string' },
      'display-name': { type: 'string' },
      help: { type: 'boolean' },
    },
    strict: true,
  });
  if (values.help || !values.username) {
    process.stdout.write(USAGE);
    process.exitCode = values.help ? 0 : 2;
    return;
  }
  let password: string;
  if (process.stdin.isTTY) {
    password = await ask('Password for the administrator: ');
    if ((await ask('The same again: ')) !== password) throw new Error('the two passwords differ');
  } else {
    password = await readPiped();
  }
  console.log(
    await createAdmin({ username: values.username, displayName: values['display-name'], password }),
  );
}

main().catch((error: unknown) => {
  console.error(`create-admin: ${(error as Error).message}`);
  process.exit(1);
});
