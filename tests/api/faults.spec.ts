import { spawn, spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureDatabase, startCluster, type Cluster } from '../../scripts/lib/postgres';
import { freePort, startService, waitForPort, type Service } from '../../scripts/lib/proc';
import { ROOT, TSX } from '../../scripts/lib/paths';
import { startSink, type Sink } from '../../server/src/mail/sink';
import { testEnv } from '../support/env';
import { demoUser, signIn, type SignedIn } from '../support/sign-in';

/**
 * Faults are normal: the real server (and a job worker) as processes, on a PostgreSQL cluster of this
 * file's own, restarted three times while clients autosave, run and save versions; the mail sink
 * stopped and started again while mail is due; and Ctrl-C on `npm start`. Bounded in time: each part
 * has a deadline, and the whole file takes about a minute.
 */
const HOST = '127.0.0.1';
const log = (line: string) => process.stdout.write(`[faults] ${line}\n`);
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

let scratch: string;
let cluster: Cluster;
let sink: Sink;
let smtpPort: number;
const services: Service[] = [];
let server: Service;
let baseUrl: string;

function serverEnv(databaseUrl: string): NodeJS.ProcessEnv {
  return {
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    HOST,
    // The identity provider of the test stack knows this address as the app's (no other server runs
    // during the API tests).
    PORT: new URL(testEnv.publicUrl).port,
    PUBLIC_URL: testEnv.publicUrl,
    OIDC_ISSUER: testEnv.oidcIssuer,
    SMTP_PORT: String(smtpPort),
    SMTP_SINK_HTTP_PORT: String(smtpPort + 1),
    DATA_DIR: path.join(scratch, 'data'),
    WEB_DIST: '/nonexistent',
    LOG_LEVEL: process.env['TEST_SERVER_LOGS'] ? 'info' : 'warn',
    ENGINE_THREADS: '1',
  };
}

beforeAll(async () => {
  scratch = mkdtempSync(path.join(tmpdir(), 'laminote-faults-'));
  chmodSync(scratch, 0o755);
  // Durable, as `npm start` keeps it: with synchronous_commit off (the throw-away test clusters), an
  // immediate shutdown loses commits that were already acknowledged, and this drill catches that.
  cluster = await startCluster(path.join(scratch, 'pg'), await freePort(), log, { mode: 'durable', secretFile: path.join(scratch, 'pg-password') });
  await ensureDatabase(cluster.url('postgres'), 'laminote');
  smtpPort = await freePort();
  sink = await startSink({ smtpPort });
  const env = serverEnv(cluster.url('laminote'));
  const seed = spawnSync(TSX, ['server/src/seed/main.ts'], { cwd: ROOT, env: { ...process.env, ...env }, encoding: 'utf8' });
  if (seed.status !== 0) throw new Error(`seeding failed: ${seed.stderr}`);
  server = startService('server', TSX, ['server/src/main.ts'], env, { quiet: !process.env['TEST_SERVER_LOGS'] });
  services.push(server);
  await waitForPort(HOST, Number(env['PORT']), 60_000, server.child);
  if (existsSync(path.join(ROOT, 'server/src/jobs/worker-main.ts'))) {
    services.push(startService('worker', TSX, ['server/src/jobs/worker-main.ts'], env, { quiet: !process.env['TEST_SERVER_LOGS'] }));
  }
  baseUrl = testEnv.publicUrl;
}, 120_000);

afterAll(async () => {
  for (const service of services.reverse()) await service.stop();
  await sink?.stop();
  cluster?.stop();
  if (scratch) rmSync(scratch, { recursive: true, force: true });
});

/** Signs in against the running server (supertest takes its address in place of an app). */
const signInLive = (role: Parameters<typeof signIn>[1]) => signIn(baseUrl as unknown as Express, role, testEnv.publicUrl);

/** Runs a program and waits for it without blocking this process (the clients keep working meanwhile). */
function runAsync(cmd: string, args: string[]): Promise<{ status: number | null; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (c: Buffer) => (stderr += c.toString()));
    child.once('exit', (status) => resolve({ status, stderr }));
  });
}

async function restartCluster(mode: 'fast' | 'immediate'): Promise<void> {
  const bin = path.dirname(spawnSync('sh', ['-c', 'ls /usr/lib/postgresql/*/bin/pg_ctl | sort -V | tail -1'], { encoding: 'utf8' }).stdout.trim());
  // As the cluster's owner, as scripts/lib/postgres.ts runs it.
  const dataDir = path.join(scratch, 'pg');
  const ctl = path.join(bin, 'pg_ctl');
  const asOwner = (args: string[]) => (process.getuid?.() === 0 ? runAsync('runuser', ['-u', 'laminote', '--', ctl, ...args]) : runAsync(ctl, args));
  const stop = await asOwner(['-D', dataDir, '-m', mode, '-w', 'stop']);
  if (stop.status !== 0) throw new Error(`pg_ctl stop failed: ${stop.stderr}`);
  // Down for a while, as a restart by an operator or a package upgrade would leave it.
  await sleep(2000);
  const start = await asOwner(['-D', dataDir, '-l', path.join(scratch, 'pg-run', 'postgres.log'), '-o', `-p ${cluster.port} -h 127.0.0.1`, '-w', '-t', '60', 'start']);
  if (start.status !== 0) throw new Error(`pg_ctl start failed: ${start.stderr}`);
}

interface ClientLog {
  acknowledgedSaves: number;
  unavailable: number;
  retryAfterMissing: number;
  serverErrors: string[];
  lastAcknowledgedNote: string | null;
  acknowledgedVersions: string[];
  runs: { completed: number; failed: number; refused: number };
  internalCells: string[];
}

/**
 * One person at work on a study of their own: autosaves a note cell with a counter, now and then runs
 * the study and saves a version. Tells acknowledged from refused (503 while the database is away).
 */
async function work(who: SignedIn, studyId: string, branchId: string, until: () => boolean): Promise<ClientLog> {
  const out: ClientLog = { acknowledgedSaves: 0, unavailable: 0, retryAfterMissing: 0, serverErrors: [], lastAcknowledgedNote: null, acknowledgedVersions: [], runs: { completed: 0, failed: 0, refused: 0 }, internalCells: [] };
  const noteCell = randomUUID();
  const flowCell = randomUUID();
  let revision = 0;
  let head: string | null = null;
  const note = (n: number) => `Autosave ${n} of ${studyId.slice(0, 8)}`;
  const seen = (res: { status: number; headers: Record<string, string>; body: unknown }, what: string) => {
    if (res.status === 503) {
      out.unavailable++;
      if (!res.headers['retry-after']) out.retryAfterMissing++;
    } else if (res.status >= 500) out.serverErrors.push(`${what}: ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`);
  };
  const reload = async () => {
    const res = await who.get(`/api/branches/${branchId}/draft`);
    seen(res, 'reload');
    if (res.status === 200) revision = res.body.revision as number;
    return res.status === 200 ? (res.body as { cells: { cellId: string; inputs: { markdown?: string } }[] }) : null;
  };
  for (let n = 1; !until(); n++) {
    const cells = [
      { cellId: flowCell, kind: 'flow', title: 'Cruise', inputs: { mode: 'reynolds', reynolds: 6e6 + n, mach: 0.7, nCrit: 9 } },
      { cellId: noteCell, kind: 'note', title: 'Log', inputs: { markdown: note(n) } },
    ];
    const save = await who.put(`/api/branches/${branchId}/draft`, { baseRevision: revision, cells });
    seen(save, 'autosave');
    if (save.status === 200) {
      revision = save.body.revision as number;
      out.acknowledgedSaves++;
      out.lastAcknowledgedNote = note(n);
    } else if (save.status === 409 || save.status >= 500 || save.status === 0) {
      // A save whose answer was lost may have landed: the draft says which.
      const draft = await reload();
      const landed = draft?.cells.find((c) => c.cellId === noteCell)?.inputs.markdown;
      if (landed === note(n)) out.lastAcknowledgedNote = note(n);
    } else out.serverErrors.push(`autosave answered ${save.status} ${JSON.stringify(save.body).slice(0, 200)}`);

    if (n % 4 === 0) {
      const run = await who.post(`/api/branches/${branchId}/run`, {});
      seen(run, 'run');
      if (run.status === 202 && typeof run.body.jobId === 'string') {
        const deadline = Date.now() + 20_000;
        for (;;) {
          const job = await who.get(`/api/jobs/${run.body.jobId}`);
          seen(job, 'job');
          const state = job.status === 200 ? (job.body.state as string) : 'unknown';
          if (state === 'completed' || state === 'failed' || state === 'cancelled') {
            if (state === 'completed') out.runs.completed++;
            else {
              out.runs.failed++;
              if (!job.body.error) out.serverErrors.push(`run ${run.body.jobId} ${state} without saying why`);
            }
            for (const r of (job.body.ran ?? []) as { cellId: string; status: string; error: { message?: string } | null }[]) {
              if (r.status === 'internal') out.internalCells.push(`${r.cellId}: ${r.error?.message ?? ''}`);
            }
            break;
          }
          if (Date.now() > deadline) {
            out.serverErrors.push(`run ${run.body.jobId} still ${state} after 20 s`);
            break;
          }
          await sleep(200);
        }
      } else if (run.status === 200) {
        out.runs.completed++;
        for (const r of run.body.ran as { cellId: string; status: string; error: { message?: string } | null }[]) {
          if (r.status === 'internal') out.internalCells.push(`${r.cellId}: ${r.error?.message ?? ''}`);
        }
      } else out.runs.refused++;
    }
    if (n % 5 === 0) {
      const saved = await who.post(`/api/branches/${branchId}/versions`, { message: `Checkpoint ${n}`, expectedHeadVersionId: head });
      seen(saved, 'save version');
      if (saved.status === 201) {
        head = saved.body.id as string;
        out.acknowledgedVersions.push(head);
      } else if (saved.status === 409 || saved.status === 503) {
        // The save may have landed before the answer was lost: follow the branch's head.
        const history = await who.get(`/api/branches/${branchId}/versions`);
        seen(history, 'versions');
        if (history.status === 200 && Array.isArray(history.body) && history.body[0]) head = history.body[0].id as string;
      }
    }
    await sleep(50);
  }
  return out;
}

describe('faults', () => {
  it('rides out three PostgreSQL restarts while people autosave, run and save versions: nothing acknowledged is lost', async () => {
    const people = await Promise.all((['engineer', 'lead'] as const).map((role) => signInLive(role)));
    const projectId = (await people[0]!.get('/api/projects').expect(200)).body.find((p: { name: string }) => p.name.includes('wing')).id as string;
    const studies = await Promise.all(
      [0, 1, 2, 3].map(async (i) => {
        const who = people[i % 2]!;
        const study = await who.post(`/api/projects/${projectId}/studies`, { title: `Fault drill ${i} (invented)` }).expect(201);
        const branches = await who.get(`/api/studies/${study.body.id}/branches`).expect(200);
        return { who, studyId: study.body.id as string, branchId: branches.body[0].id as string };
      }),
    );
    let stop = false;
    const clients = studies.map((s) => work(s.who, s.studyId, s.branchId, () => stop));
    let restarts = 0;
    for (const mode of ['fast', 'immediate', 'fast'] as const) {
      await sleep(2500);
      await restartCluster(mode);
      restarts++;
      expect(server.child.exitCode, 'the server process ended').toBeNull();
    }
    await sleep(4000);
    stop = true;
    const logs = await Promise.all(clients);

    // The server answers again by itself, without a restart.
    expect(server.child.exitCode).toBeNull();
    const health = await fetch(`${baseUrl}/healthz`);
    expect(health.status).toBe(200);

    const total = logs.reduce((n, l) => ({ saves: n.saves + l.acknowledgedSaves, unavailable: n.unavailable + l.unavailable, versions: n.versions + l.acknowledgedVersions.length }), { saves: 0, unavailable: 0, versions: 0 });
    expect(total.unavailable, 'no request met the database away: the drill did not test anything').toBeGreaterThan(0);
    const runs = logs.reduce((n, l) => ({ completed: n.completed + l.runs.completed, failed: n.failed + l.runs.failed, refused: n.refused + l.runs.refused }), { completed: 0, failed: 0, refused: 0 });
    log(
      `${restarts} restarts survived; ${total.saves} autosaves and ${total.versions} versions acknowledged; ${total.unavailable} answers 503 while the database was away; ` +
        `runs: ${runs.completed} completed, ${runs.failed} failed with a reason, ${runs.refused} refused`,
    );
    for (const [i, l] of logs.entries()) {
      expect(l.serverErrors, `client ${i}`).toEqual([]);
      expect(l.internalCells, `client ${i}: cells marked internal`).toEqual([]);
      expect(l.retryAfterMissing, `client ${i}: 503 without Retry-After`).toBe(0);
      expect(l.acknowledgedSaves).toBeGreaterThan(0);
      // Every acknowledged edit is there: the draft holds the last one.
      const draft = await studies[i]!.who.get(`/api/branches/${studies[i]!.branchId}/draft`).expect(200);
      const noteText = draft.body.cells.find((c: { kind: string }) => c.kind === 'note')?.inputs.markdown;
      expect(noteText).toBe(l.lastAcknowledgedNote);
      // Every acknowledged version is there, once.
      const history = await studies[i]!.who.get(`/api/branches/${studies[i]!.branchId}/versions`).expect(200);
      const ids = (history.body as { id: string }[]).map((v) => v.id);
      for (const id of l.acknowledgedVersions) expect(ids.filter((x) => x === id)).toHaveLength(1);
      expect(new Set(ids).size).toBe(ids.length);
    }
    expect(restarts).toBe(3);
  }, 120_000);

  it('delivers each mail exactly once when the mail sink was down while it was due', async () => {
    const reviewer = await signInLive('reviewer');
    const engineerEmail = demoUser('engineer').email;
    const projectId = (await reviewer.get('/api/projects').expect(200)).body.find((p: { name: string }) => p.name.includes('wing')).id as string;
    const study = (await reviewer.get(`/api/projects/${projectId}/studies`).expect(200)).body.find((s: { title: string }) => !s.title.startsWith('Fault drill'));
    const version = (await reviewer.get(`/api/studies/${study.id}/versions`).expect(200)).body;
    const versionId: string | undefined = version?.versions?.[0]?.id ?? version?.[0]?.id;
    const branchId = (await reviewer.get(`/api/studies/${study.id}/branches`).expect(200)).body[0].id as string;
    const cellId = (await reviewer.get(`/api/branches/${branchId}/draft`).expect(200)).body.cells[0].cellId as string;
    sink.clear();
    await sink.stop();
    const count = 5;
    const tags: string[] = [];
    for (let i = 0; i < count; i++) {
      const tag = `drill-${randomUUID().slice(0, 8)}`;
      tags.push(tag);
      const body = { cellId, ...(versionId ? { versionId } : { versionId: null, branchId }), body: `@${engineerEmail} mail drill ${tag}` };
      const res = await reviewer.post(`/api/studies/${study.id}/threads`, body);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    // The outbox tries, fails (nothing listens), and backs off.
    await sleep(2500);
    sink = await startSink({ smtpPort });
    const deadline = Date.now() + 45_000;
    const received = () => sink.messages().filter((m) => tags.some((tag) => m.text.includes(tag)));
    while (received().length < count && Date.now() < deadline) await sleep(500);
    // Then a little longer: a second copy would come now.
    await sleep(3000);
    const byTag = tags.map((tag) => received().filter((m) => m.text.includes(tag)).length);
    log(`${count} mails due while the sink was down; delivered: ${byTag.join(', ')} (each should be 1)`);
    expect(byTag).toEqual(tags.map(() => 1));
  }, 90_000);

  it('stops the PostgreSQL it started when npm start gets Ctrl-C, after making an old cluster durable and password-protected', async () => {
    const dataDir = path.join(scratch, 'start-data');
    const pgPort = await freePort();
    // A cluster as the old start command made it: no fsync, every local user trusted.
    const old = await startCluster(path.join(dataDir, 'pg'), pgPort, log, { mode: 'throwaway' });
    old.stop();
    const ports = { PORT: await freePort(), OIDC_PORT: await freePort(), SMTP_PORT: await freePort(), SMTP_SINK_HTTP_PORT: await freePort() };
    const child = spawn(process.execPath, [path.join(ROOT, 'scripts/run.mjs'), 'start.ts'], {
      cwd: ROOT,
      // Its own process group, so a "Ctrl-C" reaches the whole group as a terminal's would.
      detached: true,
      env: { ...process.env, LAMINOTE_DATA_DIR: dataDir, PGPORT: String(pgPort), LAMINOTE_SKIP_WEB_BUILD: '1', DATABASE_URL: '', ...Object.fromEntries(Object.entries(ports).map(([k, v]) => [k, String(v)])) },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout.on('data', (c: Buffer) => (output += c.toString()));
    child.stderr.on('data', (c: Buffer) => (output += c.toString()));
    const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
    const deadline = Date.now() + 90_000;
    while (!output.includes('Press Ctrl-C') && Date.now() < deadline && child.exitCode === null) await sleep(250);
    expect(output, output.slice(-2000)).toContain('Press Ctrl-C');

    const secretFile = path.join(dataDir, 'pg-password');
    expect((await import('node:fs')).statSync(secretFile).mode & 0o777).toBe(0o600);
    const secret = readFileSync(secretFile, 'utf8').trim();
    const withoutPassword = new pg.Client({ host: HOST, port: pgPort, user: 'laminote', database: 'laminote', password: '' });
    await expect(withoutPassword.connect()).rejects.toThrow();
    const client = new pg.Client({ host: HOST, port: pgPort, user: 'laminote', database: 'laminote', password: secret });
    await client.connect();
    const settings = await client.query<{ name: string; setting: string }>(`select name, setting from pg_settings where name in ('fsync', 'synchronous_commit', 'full_page_writes')`);
    await client.end();
    expect(Object.fromEntries(settings.rows.map((r) => [r.name, r.setting]))).toEqual({ fsync: 'on', synchronous_commit: 'on', full_page_writes: 'on' });

    process.kill(-child.pid!, 'SIGINT');
    const code = await Promise.race([exited, sleep(40_000).then(() => 'timeout' as const)]);
    expect(code, output.slice(-2000)).not.toBe('timeout');
    const left = spawnSync('sh', ['-c', `ps -eo args | grep -F -- '${path.join(dataDir, 'pg')}' | grep -v grep | grep postgres`], { encoding: 'utf8' }).stdout.trim();
    expect(left, 'PostgreSQL left running after Ctrl-C').toBe('');
    expect(existsSync(path.join(dataDir, 'pg', 'postmaster.pid'))).toBe(false);
  }, 150_000);
});
