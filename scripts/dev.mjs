#!/usr/bin/env node
// `npm run dev`: the simulator, the gateway recompiled and restarted on change, and Vite's dev server
// (http://localhost:5173, proxying /api and /socket.io to the gateway on :3000).
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { runTree } from './process-tree.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const bin = (pkg, file) => join(root, 'node_modules', pkg, file);

runTree([
  { name: 'simulator', args: [join(root, 'simulator/dist/cli.js'), ...process.argv.slice(2)] },
  {
    name: 'gateway compiler',
    args: [
      bin('typescript', 'bin/tsc'),
      '-p',
      join(root, 'gateway/tsconfig.build.json'),
      '--watch',
      '--preserveWatchOutput',
    ],
  },
  {
    name: 'gateway',
    args: ['--watch-path', join(root, 'gateway/dist'), join(root, 'gateway/dist/main.js')],
  },
  { name: 'vite', args: [bin('vite', 'bin/vite.js'), join(root, 'console')] },
]);
