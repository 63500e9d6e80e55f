/**
 * `npm test`: every test, with the services they need started here and stopped afterwards.
 *
 *   1. unit tests of the engine, contracts and server (vitest projects libs, server)
 *   2. API tests with supertest against real PostgreSQL (project api): a throw-away cluster (or a
 *      throw-away database on DATABASE_URL's server), the identity provider fake, the SMTP sink
 *   3. the web app's unit tests through Angular's unit-test builder (vitest)
 *   4. end-to-end tests in Debian's chromium against the built app (project e2e)
 *
 * `npm test -- --only unit,api,web,e2e` runs a subset (comma-separated).
 */
import { spawn } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { connect } from '../server/src/db/client';
import { applyMigrations } from '../server/src/db/migrate';
import { ensureDatabase, startCluster, type Cluster } from './lib/postgres';
import { freePort, startService, waitForPort, type Service } from './lib/proc';
import { NG, ROOT, TSX, VITEST, webBuildIsCurrent } from './lib/paths';

const PHASES = ['unit', 'api', 'web', 'e2e'] as const;
type Phase = (typeof PHASES)[number];
const onlyArg = process.argv.find((a) => a.startsWith('--only'));
const onlyValue = onlyArg?.includes('=') ? onlyArg.split('=')[1] : onlyArg ? process.argv[process.argv.indexOf(onlyArg) + 1] : undefined;
const phases = new Set<Phase>(onlyValue ? (onlyValue.split(',') as Phase[]) : PHASES);
const HOST = '127.0.0.1';
const log = (line: string) => process.stdout.write(`[test] ${line}\n`);

const services: Service[] = [];
let cluster: Cluster | null = null;
let scratch: string | null = null;
const results: { phase: string; passed: number; failed: number; ok: boolean; seconds: number }[] = [];

async function cleanup(): Promise<void> {
  for (const service of services.reverse()) await service.stop();
  cluster?.stop();
  if (scratch) rmSync(scratch, { recursive: true, force: true });
}
process.on('SIGINT', () => void cleanup().then(() => process.exit(130)));

/** Run a command, echoing its output, and count its passed/failed tests from vitest's summary. */
function run(phase: string, cmd: string, args: string[], env: NodeJS.ProcessEnv): Promise<void> {
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
      resolve();
    });
  });
}

async function main(): Promise<void> {
  const needServices = phases.has('api') || phases.has('e2e');
  const env: NodeJS.ProcessEnv = { NODE_ENV: 'test', NG_CLI_ANALYTICS: 'false' };

  if (phases.has('unit')) await run('unit', VITEST, ['run', '--project', 'libs', '--project', 'server'], env);

  if (needServices) {
    scratch = mkdtempSync(path.join(tmpdir(), 'laminote-test-'));
    chmodSync(scratch, 0o755);
    let adminUrl: string;
    if (process.env['DATABASE_URL']) {
      adminUrl = process.env['DATABASE_URL'];
      log('using the PostgreSQL server of DATABASE_URL for throw-away test databases');
    } else {
      cluster = await startCluster(path.join(scratch, 'pg'), await freePort(), log);
      adminUrl = cluster.url('postgres');
    }
    const template = `laminote_template_${process.pid}`;
    await ensureDatabase(adminUrl, template, { recreate: true });
    const templateUrl = new URL(adminUrl);
    templateUrl.pathname = `/${template}`;
    const migrated = connect(templateUrl.href, 1);
    await applyMigrations(migrated.db);
    await migrated.close();

    const [oidcPort, appPort, smtpPort] = [await freePort(), await freePort(), await freePort()];
    const publicUrl = `http://${HOST}:${appPort}`;
    Object.assign(env, {
      TEST_PG_ADMIN_URL: adminUrl,
      TEST_TEMPLATE_DB: template,
      OIDC_PORT: String(oidcPort),
      OIDC_ISSUER: `http://${HOST}:${oidcPort}`,
      OIDC_REDIRECT_URIS: `${publicUrl}/auth/callback`,
      OIDC_POST_LOGOUT_URIS: `${publicUrl}/`,
      PUBLIC_URL: publicUrl,
      APP_PORT: String(appPort),
      SMTP_PORT: String(smtpPort),
      DATA_DIR: path.join(scratch, 'data'),
      LOG_LEVEL: 'warn',
    });
    const oidc = startService('identity', TSX, ['oidc-fake/src/main.ts'], env, { quiet: true });
    services.push(oidc);
    await waitForPort(HOST, oidcPort, 60_000, oidc.child);

    if (phases.has('api')) await run('api', VITEST, ['run', '--project', 'api'], env);
  }

  if (phases.has('web')) await run('web', NG, ['test', 'web', '--watch=false'], env);

  if (phases.has('e2e')) {
    if (!webBuildIsCurrent()) {
      log('building the web app for the browser tests …');
      await run('build', NG, ['build', 'web'], env);
    }
    // The browser tests drive the real server, on a seeded database of their own.
    const e2eDb = `laminote_e2e_${process.pid}`;
    const pool = new pg.Pool({ connectionString: env['TEST_PG_ADMIN_URL'] as string, max: 1 });
    await pool.query(`create database ${e2eDb} template ${env['TEST_TEMPLATE_DB'] as string}`);
    await pool.end();
    const dbUrl = new URL(env['TEST_PG_ADMIN_URL'] as string);
    dbUrl.pathname = `/${e2eDb}`;
    const serverEnv = { ...env, DATABASE_URL: dbUrl.href, PORT: env['APP_PORT'], HOST, NODE_ENV: 'production', SESSION_SECRET: 'e2e-only-session-secret-0123456789' };
    await run('seed', TSX, ['server/src/seed/main.ts'], serverEnv);
    const server = startService('server', TSX, ['server/src/main.ts'], serverEnv, { quiet: true });
    services.push(server);
    await waitForPort(HOST, Number(env['APP_PORT']), 60_000, server.child);
    await run('e2e', VITEST, ['run', '--project', 'e2e'], { ...env, APP_URL: env['PUBLIC_URL'], DATABASE_URL: dbUrl.href });
  }
}

main()
  .catch((err: unknown) => {
    process.stderr.write(`[test] ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
    results.push({ phase: 'setup', passed: 0, failed: 1, ok: false, seconds: 0 });
  })
  .finally(async () => {
    await cleanup();
    process.stdout.write('\n[test] summary\n');
    for (const r of results) process.stdout.write(`  ${r.ok ? 'ok  ' : 'FAIL'} ${r.phase.padEnd(6)} ${r.passed} passed, ${r.failed} failed (${r.seconds.toFixed(1)} s)\n`);
    const passed = results.reduce((n, r) => n + r.passed, 0);
    const failed = results.reduce((n, r) => n + r.failed, 0);
    const ok = results.length > 0 && results.every((r) => r.ok);
    process.stdout.write(`\n${passed} passed, ${failed} failed\n`);
    process.exit(ok ? 0 : 1);
  });
