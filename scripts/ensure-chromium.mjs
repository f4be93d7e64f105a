#!/usr/bin/env node
// The browser tests need Chromium. Install Debian's package when we are root; otherwise say what to install.
import { execSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const path = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
if (existsSync(path)) process.exit(0);
const root = typeof process.getuid === 'function' && process.getuid() === 0;
if (!root) {
  console.error(
    `Chromium is not installed at ${path}. Install Debian's "chromium" package (sudo apt-get install chromium), or set CHROMIUM_PATH.`,
  );
  process.exit(1);
}
console.log('Installing Debian chromium for the browser tests (about a minute)...');
execSync('apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium', {
  stdio: 'inherit',
  shell: '/bin/bash',
});
