import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync, chmodSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { connect } from '../../server/src/db/client';
import { applyMigrations } from '../../server/src/db/migrate';
import { ensureDatabase, startCluster, type Cluster } from './postgres';
import { freePort, startService, waitForPort, type Service } from './proc';
import { ROOT, TSX } from './paths';

/**
 * The throw-away services that API tests, browser tests and benchmarks run against: a PostgreSQL
 * cluster in a temporary folder (or throw-away databases on DATABASE_URL's server) with a migrated
 * template database, the identity provider fake, the SMTP sink, and on request the real server on a
 * seeded database. Everything listens on loopback, on free ports.
 */
export interface TestStack {
  env: NodeJS.ProcessEnv;
  startServer(): Promise<void>;
  stop(): Promise<void>;
}

const HOST = '127.0.0.1';

export async function startTestStack(log: (line: string) => void, runSeed: (env: NodeJS.ProcessEnv) => Promise<void>): Promise<TestStack> {
  const services: Service[] = [];
  let cluster: Cluster | null = null;
  const scratch = mkdtempSync(path.join(tmpdir(), 'laminote-test-'));
  chmodSync(scratch, 0o755);
  const stop = async () => {
    for (const service of services.reverse()) await service.stop();
    cluster?.stop();
    rmSync(scratch, { recursive: true, force: true });
  };
  try {
    let adminUrl: string;
    if (process.env['DATABASE_URL']) {
      adminUrl = process.env['DATABASE_URL'];
      log('using the PostgreSQL server of DATABASE_URL for throw-away databases');
    } else {
      cluster = await startCluster(path.join(scratch, 'pg'), await freePort(), log, { mode: 'throwaway' });
      adminUrl = cluster.url('postgres');
    }
    const template = `laminote_template_${process.pid}`;
    await ensureDatabase(adminUrl, template, { recreate: true });
    const templateUrl = new URL(adminUrl);
    templateUrl.pathname = `/${template}`;
    const migrated = connect(templateUrl.href, 1);
    await applyMigrations(migrated.db);
    await migrated.close();

    const [oidcPort, appPort, smtpPort, sinkHttpPort] = [await freePort(), await freePort(), await freePort(), await freePort()];
    const publicUrl = `http://${HOST}:${appPort}`;
    const env: NodeJS.ProcessEnv = {
      NODE_ENV: 'test',
      NG_CLI_ANALYTICS: 'false',
      TEST_PG_ADMIN_URL: adminUrl,
      TEST_TEMPLATE_DB: template,
      OIDC_PORT: String(oidcPort),
      OIDC_ISSUER: `http://${HOST}:${oidcPort}`,
      OIDC_REDIRECT_URIS: `${publicUrl}/auth/callback`,
      OIDC_POST_LOGOUT_URIS: `${publicUrl}/`,
      PUBLIC_URL: publicUrl,
      APP_PORT: String(appPort),
      SMTP_PORT: String(smtpPort),
      SMTP_SINK_HTTP_PORT: String(sinkHttpPort),
      DATA_DIR: path.join(scratch, 'data'),
      LOG_LEVEL: 'warn',
      // The provider fake and the app share a client secret of this run's own: the server runs as in
      // production, which refuses the built-in one.
      OIDC_CLIENT_SECRET: randomBytes(24).toString('hex'),
      // The tests sign many people in within a minute; the budget itself is tested with its own.
      SIGN_IN_RATE_PER_MINUTE: '100000',
    };
    const oidc = startService('identity', TSX, ['oidc-fake/src/main.ts'], env, { quiet: true });
    services.push(oidc);
    await waitForPort(HOST, oidcPort, 60_000, oidc.child);
    if (existsSync(path.join(ROOT, 'server/src/mail/sink-main.ts'))) {
      const sink = startService('smtp-sink', TSX, ['server/src/mail/sink-main.ts'], env, { quiet: true });
      services.push(sink);
      await waitForPort(HOST, smtpPort, 60_000, sink.child);
    }

    return {
      env,
      stop,
      // The real server on a seeded database of its own, as the browser tests and benchmarks use it.
      async startServer() {
        const dbName = `laminote_app_${process.pid}`;
        const pool = new pg.Pool({ connectionString: adminUrl, max: 1 });
        await pool.query(`drop database if exists ${dbName} with (force)`);
        await pool.query(`create database ${dbName} template ${template}`);
        await pool.end();
        const dbUrl = new URL(adminUrl);
        dbUrl.pathname = `/${dbName}`;
        Object.assign(env, { DATABASE_URL: dbUrl.href, APP_URL: publicUrl });
        const serverEnv = { ...env, PORT: String(appPort), HOST, NODE_ENV: 'production', SESSION_SECRET: 'throw-away-test-session-secret-0123456789' };
        await runSeed(serverEnv);
        const server = startService('server', TSX, ['server/src/main.ts'], serverEnv, { quiet: !process.env['TEST_SERVER_LOGS'] });
        services.push(server);
        await waitForPort(HOST, appPort, 60_000, server.child);
        // Runs are jobs: one worker process computes them, as under npm start. It runs as one node
        // process (tsx loaded as a module, not tsx's own launcher and a child), so its pid is the
        // worker's: a browser test pauses it (SIGSTOP) to see a run under way without racing its end.
        const worker = startService('worker', process.execPath, ['--import', 'tsx', 'server/src/jobs/worker-main.ts'], serverEnv, { quiet: !process.env['TEST_SERVER_LOGS'] });
        services.push(worker);
        Object.assign(env, { TEST_WORKER_PID: String(worker.child.pid) });
      },
    };
  } catch (err) {
    await stop();
    throw err;
  }
}
