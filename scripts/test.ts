/**
 * `npm test`: every test, with the services they need started here and stopped afterwards.
 *
 *   unit  the engine, contracts, identity fake and server units (vitest projects libs, server)
 *   api   API tests with supertest against real PostgreSQL (project api)
 *   web   the web app's unit tests through Angular's unit-test builder (vitest)
 *   e2e   browser tests in Debian's chromium against the built app and the real server (project e2e)
 *
 * `npm test -- --only api,e2e` runs a subset; `--files a,b` passes file filters to vitest in every
 * phase it runs (`npm test -- --only api --files tests/api/notebook.spec.ts`).
 */
import { spawn } from 'node:child_process';
import { startTestStack, type TestStack } from './lib/stack';
import { NG, ROOT, TSX, VITEST, WEB_DIST, webBuildIsCurrent } from './lib/paths';
import { finishWebBuild, WEB_BUILD_ENV } from './lib/web-build';

const PHASES = ['unit', 'api', 'web', 'e2e'] as const;
type Phase = (typeof PHASES)[number];
const onlyIndex = process.argv.findIndex((a) => a === '--only' || a.startsWith('--only='));
const onlyValue = onlyIndex < 0 ? undefined : (process.argv[onlyIndex]!.split('=')[1] ?? process.argv[onlyIndex + 1]);
const phases = new Set<string>(onlyValue ? onlyValue.split(',') : PHASES);
const filesIndex = process.argv.findIndex((a) => a === '--files' || a.startsWith('--files='));
const fileFilters = filesIndex < 0 ? [] : (process.argv[filesIndex]!.split('=')[1] ?? process.argv[filesIndex + 1] ?? '').split(',').filter(Boolean);
for (const p of phases) if (!(PHASES as readonly string[]).includes(p)) throw new Error(`--only: unknown phase "${p}" (use ${PHASES.join(', ')})`);
const log = (line: string) => process.stdout.write(`[test] ${line}\n`);

let stack: TestStack | null = null;
const results: { phase: string; passed: number; failed: number; ok: boolean; seconds: number }[] = [];
process.on('SIGINT', () => void (stack?.stop() ?? Promise.resolve()).then(() => process.exit(130)));

/** Run a command, echoing its output, and count passed/failed tests from vitest's summary line. */
function run(phase: string, cmd: string, args: string[], env: NodeJS.ProcessEnv): Promise<boolean> {
  const t0 = Date.now();
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { cwd: ROOT, env: { ...process.env, ...env, NO_COLOR: '1' }, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (c: Buffer) => {
      out += c.toString();
      process.stdout.write(c);
    });
    child.stderr.on('data', (c: Buffer) => process.stderr.write(c));
    child.on('exit', (code) => {
      const tests = /^\s*Tests\s+(.*)$/m.exec(out.replace(/\x1b\[[0-9;]*m/g, ''))?.[1] ?? '';
      const passed = Number(/(\d+) passed/.exec(tests)?.[1] ?? 0);
      // A phase that fails without a failed test (a build or setup error) counts as one failure.
      const failed = Math.max(Number(/(\d+) failed/.exec(tests)?.[1] ?? 0), code === 0 ? 0 : 1);
      results.push({ phase, passed, failed, ok: code === 0, seconds: (Date.now() - t0) / 1000 });
      resolve(code === 0);
    });
  });
}

const seed = async (env: NodeJS.ProcessEnv) => {
  if (!(await run('seed', TSX, ['server/src/seed/main.ts'], env))) throw new Error('seeding the browser-test database failed');
};

async function main(): Promise<void> {
  const base: NodeJS.ProcessEnv = { NODE_ENV: 'test', NG_CLI_ANALYTICS: 'false' };
  if (phases.has('unit')) await run('unit', VITEST, ['run', '--project', 'libs', '--project', 'server', ...fileFilters], base);
  if (phases.has('api') || phases.has('e2e')) stack = await startTestStack(log, seed);
  if (phases.has('api')) await run('api', VITEST, ['run', '--project', 'api', ...fileFilters], stack!.env);
  if (phases.has('web')) await run('web', NG, ['test', 'web', '--watch=false'], base);
  if (phases.has('e2e')) {
    if (!webBuildIsCurrent()) {
      log('building the web app for the browser tests …');
      if (!(await run('build', NG, ['build', 'web'], { ...base, ...WEB_BUILD_ENV }))) return;
      finishWebBuild(WEB_DIST);
    }
    await stack!.startServer();
    await run('e2e', VITEST, ['run', '--project', 'e2e', ...fileFilters], stack!.env);
  }
}

main()
  .catch((err: unknown) => {
    process.stderr.write(`[test] ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
    results.push({ phase: 'setup', passed: 0, failed: 1, ok: false, seconds: 0 });
  })
  .finally(async () => {
    await stack?.stop();
    process.stdout.write('\n[test] summary\n');
    for (const r of results) process.stdout.write(`  ${r.ok ? 'ok  ' : 'FAIL'} ${r.phase.padEnd(6)} ${r.passed} passed, ${r.failed} failed (${r.seconds.toFixed(1)} s)\n`);
    const passed = results.reduce((n, r) => n + r.passed, 0);
    const failed = results.reduce((n, r) => n + r.failed, 0);
    const ok = results.length > 0 && results.every((r) => r.ok);
    process.stdout.write(`\n${passed} passed, ${failed} failed\n`);
    process.exit(ok ? 0 : 1);
  });
