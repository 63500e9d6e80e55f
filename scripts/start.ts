/**
 * `npm start`: everything on loopback with the demo scenario seeded. Installs what is missing, builds
 * the web app, starts PostgreSQL (the project's own cluster under .data/, unless DATABASE_URL points at
 * one), migrates, seeds, then runs the identity provider fake, the SMTP sink and the server. Ctrl-C
 * stops all of it.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { DEMO_USERS } from '../oidc-fake/src/users';
import { ensureDatabase, startCluster, type Cluster } from './lib/postgres';
import { portIsFree, startService, waitForPort, type Service } from './lib/proc';
import { DATA_DIR, NG, ROOT, TSX, webBuildIsCurrent } from './lib/paths';

const HOST = '127.0.0.1';
const PORT = Number(process.env['PORT'] ?? 4200);
const OIDC_PORT = Number(process.env['OIDC_PORT'] ?? 4400);
const SMTP_PORT = Number(process.env['SMTP_PORT'] ?? 2525);
const PGPORT = Number(process.env['PGPORT'] ?? 54320);
const log = (line: string) => process.stdout.write(`[start] ${line}\n`);
const started = Date.now();

const services: Service[] = [];
let cluster: Cluster | null = null;
let stopping = false;

async function stopAll(code: number): Promise<never> {
  if (!stopping) {
    stopping = true;
    log('stopping …');
    for (const service of services.reverse()) await service.stop();
    cluster?.stop();
  }
  process.exit(code);
}
process.on('SIGINT', () => void stopAll(0));
process.on('SIGTERM', () => void stopAll(0));

async function main(): Promise<void> {
  if (!existsSync(path.join(ROOT, 'node_modules/.bin/ng'))) {
    log('installing dependencies (npm ci) …');
    execFileSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: ROOT, stdio: 'inherit' });
  }
  const sinkHttpPort = Number(process.env['SMTP_SINK_HTTP_PORT'] ?? 2526);
  for (const [name, port] of [['app', PORT], ['identity provider', OIDC_PORT], ['SMTP sink', SMTP_PORT], ['SMTP sink web page', sinkHttpPort]] as const) {
    if (!(await portIsFree(HOST, port))) throw new Error(`port ${port} (${name}) is in use: is Laminote already running? Stop it, or set another port.`);
  }
  if (webBuildIsCurrent()) log('web app build is current');
  else {
    log('building the web app …');
    const build = spawnSync(NG, ['build', 'web'], { cwd: ROOT, stdio: 'inherit', env: { ...process.env, NG_CLI_ANALYTICS: 'false' } });
    if (build.status !== 0) throw new Error('the web app did not build (see above)');
  }

  let databaseUrl = process.env['DATABASE_URL'];
  if (!databaseUrl) {
    cluster = await startCluster(path.join(DATA_DIR, 'pg'), PGPORT, log);
    await ensureDatabase(cluster.url('postgres'), 'laminote');
    databaseUrl = cluster.url('laminote');
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

  const oidc = startService('identity', TSX, ['oidc-fake/src/main.ts'], env);
  services.push(oidc);
  await waitForPort(HOST, OIDC_PORT, 60_000, oidc.child);
  if (existsSync(path.join(ROOT, 'server/src/mail/sink-main.ts'))) {
    const sink = startService('smtp-sink', TSX, ['server/src/mail/sink-main.ts'], env);
    services.push(sink);
    await waitForPort(HOST, SMTP_PORT, 60_000, sink.child);
  }
  const server = startService('server', TSX, ['server/src/main.ts'], env);
  services.push(server);
  await waitForPort(HOST, PORT, 60_000, server.child);
  for (const service of services) {
    service.child.once('exit', (code) => {
      if (!stopping) {
        log(`${service.name} stopped unexpectedly (exit ${code}); stopping everything`);
        void stopAll(1);
      }
    });
  }

  const width = Math.max(...DEMO_USERS.map((u) => u.name.length));
  const who = DEMO_USERS.map((u) => `    ${u.name.padEnd(width)}  ${(u.siteAdmin ? 'site admin' : (u.role ?? 'no project')).padEnd(10)}  ${u.email}`).join('\n');
  process.stdout.write(
    `\nLaminote is running (ready in ${((Date.now() - started) / 1000).toFixed(1)} s):\n\n` +
      `  app and API         ${publicUrl}\n  identity provider   http://${HOST}:${OIDC_PORT}\n` +
      `  SMTP sink           ${HOST}:${SMTP_PORT}\n  PostgreSQL          ${databaseUrl.replace(/\/\/[^@]*@/, '//')}\n\n` +
      `  Demo sign-ins (invented people of the fictional Tamsk Aerodynamics; pick one on the sign-in page):\n${who}\n\n` +
      '  Press Ctrl-C to stop.\n\n',
  );
}

main().catch(async (err: unknown) => {
  process.stderr.write(`[start] ${err instanceof Error ? err.message : String(err)}\n`);
  await stopAll(1);
});
