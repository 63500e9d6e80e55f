/**
 * `npm start`: everything on loopback with the demo scenario seeded. Installs what is missing, builds
 * the web app, starts PostgreSQL (the project's own cluster under .data/, unless DATABASE_URL points at
 * one), migrates, seeds, then runs the identity provider fake, the SMTP sink and the server. A service
 * that crashes is started again with back-off; everything stops only when the server or PostgreSQL
 * cannot come back. Ctrl-C (SIGINT) or SIGTERM stops all of it, the cluster included.
 *
 * The cluster keeps PostgreSQL's durable defaults and asks every connection for the password kept in
 * `.data/pg-password` (mode 600). LAMINOTE_SKIP_WEB_BUILD=1 starts without building the web app (the
 * API alone; the fault tests use it).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { DEMO_USERS } from '../oidc-fake/src/users';
import { ensureDatabase, startCluster, stopClusterBeingStarted, type Cluster } from './lib/postgres';
import { portIsFree, startService, supervise, waitForPort, type Supervised } from './lib/proc';
import { DATA_DIR, ROOT, TSX, webBuildIsCurrent } from './lib/paths';
import { buildWeb } from './lib/web-build';

const HOST = '127.0.0.1';
const PORT = Number(process.env['PORT'] ?? 4200);
const OIDC_PORT = Number(process.env['OIDC_PORT'] ?? 4400);
const SMTP_PORT = Number(process.env['SMTP_PORT'] ?? 2525);
const PGPORT = Number(process.env['PGPORT'] ?? 54320);
const log = (line: string) => process.stdout.write(`[start] ${line}\n`);
const started = Date.now();

const services: Supervised[] = [];
let cluster: Cluster | null = null;
let clusterWatch: NodeJS.Timeout | null = null;
let stopped: Promise<void> | null = null;

/**
 * Stops everything once. Ctrl-C in a terminal reaches this process twice (from the terminal, and
 * forwarded by scripts/run.mjs and npm): later signals wait for the same stop instead of exiting early
 * and leaving PostgreSQL behind.
 */
function stopAll(code: number): Promise<void> {
  stopped ??= (async () => {
    log('stopping …');
    if (clusterWatch) clearInterval(clusterWatch);
    // Every supervisor is told at once, so a helper that Ctrl-C reached first is not started again.
    await Promise.all(services.map((service) => service.stop().catch(() => undefined)));
    if (cluster) {
      log('stopping PostgreSQL …');
      cluster.stop();
    } else stopClusterBeingStarted();
    process.exit(code);
  })();
  return stopped;
}
process.on('SIGINT', () => void stopAll(0));
process.on('SIGTERM', () => void stopAll(0));
process.on('SIGHUP', () => void stopAll(0));

/**
 * Starts PostgreSQL again should it stop under us (a crash, an OOM kill); gives up, and stops
 * everything, when it does not come back.
 */
function watchCluster(c: Cluster): void {
  let failures = 0;
  let missed = 0;
  let busy = false;
  clusterWatch = setInterval(() => {
    if (busy || stopped) return;
    if (c.isRunning()) {
      missed = 0;
      return;
    }
    // Seen down twice in a row: someone restarting it by hand has had the time to do so.
    if (++missed < 2) return;
    busy = true;
    failures++;
    log(`PostgreSQL is not running; starting it again (attempt ${failures}) …`);
    try {
      c.restart();
      log('PostgreSQL is running again');
      failures = 0;
    } catch (err) {
      log(`PostgreSQL did not start: ${err instanceof Error ? err.message : String(err)}`);
      if (failures >= 3) {
        log('PostgreSQL cannot come back; stopping everything');
        void stopAll(1);
      }
    }
    busy = false;
  }, 5000);
}

async function main(): Promise<void> {
  if (!existsSync(path.join(ROOT, 'node_modules/.bin/ng'))) {
    log('installing dependencies (npm ci) …');
    execFileSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: ROOT, stdio: 'inherit' });
  }
  const sinkHttpPort = Number(process.env['SMTP_SINK_HTTP_PORT'] ?? 2526);
  for (const [name, port] of [['app', PORT], ['identity provider', OIDC_PORT], ['SMTP sink', SMTP_PORT], ['SMTP sink web page', sinkHttpPort]] as const) {
    if (!(await portIsFree(HOST, port))) throw new Error(`port ${port} (${name}) is in use: is Laminote already running? Stop it, or set another port.`);
  }
  if (process.env['LAMINOTE_SKIP_WEB_BUILD'] === '1') log('not building the web app (LAMINOTE_SKIP_WEB_BUILD=1): the API only');
  else if (webBuildIsCurrent()) log('web app build is current');
  else {
    log('building the web app …');
    if (!buildWeb({ ...process.env, NG_CLI_ANALYTICS: 'false' })) throw new Error('the web app did not build (see above)');
  }

  let databaseUrl = process.env['DATABASE_URL'];
  if (!databaseUrl) {
    cluster = await startCluster(path.join(DATA_DIR, 'pg'), PGPORT, log, { mode: 'durable', secretFile: path.join(DATA_DIR, 'pg-password') });
    await ensureDatabase(cluster.url('postgres'), 'laminote');
    databaseUrl = cluster.url('laminote');
    watchCluster(cluster);
  }
  const publicUrl = `http://${HOST}:${PORT}`;
  const env = {
    DATABASE_URL: databaseUrl,
    PORT: String(PORT),
    HOST,
    PUBLIC_URL: publicUrl,
    OIDC_PORT: String(OIDC_PORT),
    OIDC_ISSUER: `http://${HOST}:${OIDC_PORT}`,
    OIDC_REDIRECT_URIS: `${publicUrl}/auth/callback`,
    OIDC_POST_LOGOUT_URIS: `${publicUrl}/`,
    SMTP_PORT: String(SMTP_PORT),
    DATA_DIR,
    NODE_ENV: 'development',
    APP_MODE: 'demo',
  };

  log('migrating and seeding the demo scenario …');
  const seed = spawnSync(TSX, ['server/src/seed/main.ts'], { cwd: ROOT, stdio: 'inherit', env: { ...process.env, ...env } });
  if (seed.status !== 0) throw new Error('migrating or seeding failed (see above)');

  // Helpers (identity provider, mail sink) are restarted with back-off when they crash; the server
  // too, and only a server that keeps crashing stops everything.
  const giveUp = (name: string) => {
    if (name === 'server') void stopAll(1);
    else log(`${name} stays down; the rest keeps running (restart Laminote to try it again)`);
  };
  const launch = async (name: string, script: string, port: number) => {
    let first = true;
    const service = supervise(name, () => {
      const s = startService(name, TSX, [script], env);
      if (!first) void waitForPort(HOST, port, 60_000, s.child).then(() => log(`${name} is back`), () => undefined);
      first = false;
      return s;
    }, { log, onGiveUp: giveUp });
    services.push(service);
    await waitForPort(HOST, port, 60_000, service.current().child);
  };
  await launch('identity', 'oidc-fake/src/main.ts', OIDC_PORT);
  await launch('smtp-sink', 'server/src/mail/sink-main.ts', SMTP_PORT);
  await launch('server', 'server/src/main.ts', PORT);
  // One job worker computes the runs (more can run anywhere with `npm run worker`). It listens on no
  // port; restarted with back-off like the helpers, and a run it was computing is taken up again.
  services.push(supervise('worker', () => startService('worker', TSX, ['server/src/jobs/worker-main.ts'], env), { log, onGiveUp: giveUp }));

  const width = Math.max(...DEMO_USERS.map((u) => u.name.length));
  const who = DEMO_USERS.map((u) => `    ${u.name.padEnd(width)}  ${(u.siteAdmin ? 'site admin' : (u.role ?? 'no project')).padEnd(10)}  ${u.email}`).join('\n');
  process.stdout.write(
    `\nLaminote is running (ready in ${((Date.now() - started) / 1000).toFixed(1)} s):\n\n` +
      `  app and API         ${publicUrl}\n  job worker          1 process (add more with npm run worker)\n  identity provider   http://${HOST}:${OIDC_PORT}\n` +
      `  SMTP sink           ${HOST}:${SMTP_PORT}\n  PostgreSQL          ${databaseUrl.replace(/\/\/[^@]*@/, '//')}\n\n` +
      `  Demo sign-ins (invented people of the fictional Tamsk Aerodynamics; pick one on the sign-in page):\n${who}\n\n` +
      '  Press Ctrl-C to stop.\n\n',
  );
}

main().catch(async (err: unknown) => {
  if (!stopped) process.stderr.write(`[start] ${err instanceof Error ? err.message : String(err)}\n`);
  await stopAll(1);
});
