// Plain JavaScript on purpose: `npm start` and `npm test` must work on a machine that has only Node.js
// and npm, before node_modules (and so tsx) exists. Installs dependencies when they are missing, then
// runs the TypeScript script named on the command line with tsx.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = fileURLToPath(new URL('..', import.meta.url));
const tsx = path.join(root, 'node_modules', '.bin', 'tsx');
if (!existsSync(tsx)) {
  process.stdout.write('[laminote] node_modules is missing: running npm ci …\n');
  const install = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
  if (install.status !== 0) process.exit(install.status ?? 1);
}
const [script, ...args] = process.argv.slice(2);
// Node with tsx as a loader, not the tsx command: the command relays a signal to its child and kills the
// child outright when it does not answer within 30 ms, which a busy machine or a synchronous step (pg_ctl)
// easily misses, and then the cluster the script started is never stopped.
const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'scripts', script), ...args], { cwd: root, stdio: 'inherit' });
// Ctrl-C reaches the child too (same process group); wait for it to stop its services cleanly.
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
