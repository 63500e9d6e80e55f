/**
 * `npm run bench`: every benchmark in the project (files named `*.bench.ts` under a `bench/` folder),
 * one after another, each a standalone script that prints its own figures. They run against the same
 * throw-away services as the tests (PostgreSQL, identity provider, SMTP sink, and a real server on a
 * seeded database, with APP_URL set). `npm run bench -- engine` runs only files whose path contains
 * "engine".
 */
import { spawnSync } from 'node:child_process';
import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { startTestStack } from './lib/stack';
import { ROOT, TSX, webBuildIsCurrent } from './lib/paths';
import { buildWeb } from './lib/web-build';

const filter = process.argv.slice(2).find((a) => !a.startsWith('-'));
const log = (line: string) => process.stdout.write(`[bench] ${line}\n`);

function findBenches(dir: string, out: string[] = []): string[] {
  for (const entry of readdirSync(dir)) {
    if (entry === 'node_modules' || entry.startsWith('.') || entry === 'dist') continue;
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) findBenches(full, out);
    else if (entry.endsWith('.bench.ts') && path.basename(path.dirname(full)) === 'bench') out.push(full);
  }
  return out;
}

const benches = findBenches(ROOT)
  .map((f) => path.relative(ROOT, f))
  .filter((f) => !filter || f.includes(filter))
  .sort();
if (benches.length === 0) {
  log('no benchmarks found');
  process.exit(0);
}
const needsStack = benches.some((f) => !f.startsWith('libs/'));
// Only the browser benchmarks need the built app; the API ones run the server's own routes.
const needsWeb = benches.some((f) => f.startsWith('apps/'));
if (needsWeb && !webBuildIsCurrent()) {
  log('building the web app …');
  if (!buildWeb()) process.exit(1);
}
const seed = async (env: NodeJS.ProcessEnv) => {
  if (spawnSync(TSX, ['server/src/seed/main.ts'], { cwd: ROOT, stdio: 'inherit', env: { ...process.env, ...env } }).status !== 0) throw new Error('seeding failed');
};
const stack = needsStack ? await startTestStack(log, seed) : null;
let failed = 0;
try {
  if (stack) await stack.startServer();
  for (const bench of benches) {
    log(`── ${bench}`);
    const r = spawnSync(TSX, [bench], { cwd: ROOT, stdio: 'inherit', env: { ...process.env, ...(stack?.env ?? {}), NODE_ENV: 'production' } });
    if (r.status !== 0) {
      failed++;
      log(`${bench} failed (exit ${r.status})`);
    }
  }
} finally {
  await stack?.stop();
}
process.exit(failed ? 1 : 0);
