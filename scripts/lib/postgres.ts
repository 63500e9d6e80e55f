import { execFileSync, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';

/**
 * The project's own PostgreSQL cluster, on 127.0.0.1 only. `initdb` refuses to run as root, so when we
 * are root the cluster belongs to an unprivileged system user (`laminote`), created if missing.
 */
export const CLUSTER_USER = 'laminote';
const SUPERUSER = 'laminote';

export interface Cluster {
  url: (database: string) => string;
  port: number;
  stop: () => void;
  /** Whether the postmaster is running (pg_ctl status). */
  isRunning: () => boolean;
  /** Starts a cluster that stopped (after a crash); throws when it does not come up. */
  restart: () => void;
}

const isRoot = () => process.getuid?.() === 0;

function binDir(): string | null {
  const root = '/usr/lib/postgresql';
  if (existsSync(root)) {
    const versions = readdirSync(root).filter((v) => existsSync(path.join(root, v, 'bin', 'initdb'))).sort((a, b) => Number(b) - Number(a));
    if (versions[0]) return path.join(root, versions[0], 'bin');
  }
  const which = spawnSync('sh', ['-c', 'command -v initdb'], { encoding: 'utf8' });
  return which.status === 0 ? path.dirname(which.stdout.trim()) : null;
}

/** Find PostgreSQL's server programs; install Debian's `postgresql` when root and they are missing. */
export function ensurePostgresBinaries(log: (line: string) => void): string {
  let dir = binDir();
  if (dir) return dir;
  if (isRoot() && existsSync('/usr/bin/apt-get')) {
    log("PostgreSQL is not installed; installing Debian's postgresql package …");
    execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
    execFileSync('apt-get', ['install', '-y', '-qq', '--no-install-recommends', 'postgresql'], {
      stdio: 'inherit',
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
    dir = binDir();
    if (dir) return dir;
  }
  throw new Error(
    'PostgreSQL server programs (initdb, pg_ctl) were not found. Install PostgreSQL 15 or newer ' +
      "(on Debian/Ubuntu: sudo apt-get install postgresql), or set DATABASE_URL to an existing server.",
  );
}

function ensureClusterUser(): void {
  if (spawnSync('id', ['-u', CLUSTER_USER]).status === 0) return;
  execFileSync('useradd', ['--system', '--no-create-home', '--shell', '/usr/sbin/nologin', CLUSTER_USER]);
}

/** Run a PostgreSQL program as the cluster's owner. */
function runAs(bin: string, args: string[], opts: { allowFail?: boolean } = {}) {
  const [cmd, argv] = isRoot() ? ['runuser', ['-u', CLUSTER_USER, '--', bin, ...args]] : [bin, args];
  const result = spawnSync(cmd as string, argv as string[], { encoding: 'utf8' });
  if (result.status !== 0 && !opts.allowFail) {
    throw new Error(`${path.basename(bin)} failed (exit ${result.status}):\n${result.stderr || result.stdout}`);
  }
  return result;
}

/** Whether the cluster's owner can reach `dir` (a root-only parent such as /root would stop it). */
function reachable(dir: string): boolean {
  if (!isRoot()) return true;
  return spawnSync('runuser', ['-u', CLUSTER_USER, '--', 'test', '-w', dir]).status === 0;
}

/**
 * Settings that trade durability for speed. Only throw-away clusters (tests, benchmarks) use them: with
 * them a power cut or OS crash can lose acknowledged commits and corrupt the cluster.
 */
const THROWAWAY_SETTINGS = ['fsync = off', 'synchronous_commit = off', 'full_page_writes = off'];
const DURABILITY_KEYS = ['fsync', 'synchronous_commit', 'full_page_writes'];

export interface ClusterOptions {
  /**
   * `durable` (the `npm start` cluster): PostgreSQL's durable defaults, and password authentication
   * (scram-sha-256) with a generated secret kept in `secretFile` (mode 600). `throwaway` (tests,
   * benchmarks): no fsync, local connections trusted.
   */
  mode: 'durable' | 'throwaway';
  /** Where the durable cluster's password is kept; required in durable mode. */
  secretFile?: string;
}

/** pg_hba.conf of a durable cluster: loopback and its own socket only, every connection with a password. */
const DURABLE_HBA = [
  '# Written by Laminote (scripts/lib/postgres.ts): every connection needs the password kept under .data/.',
  '# TYPE  DATABASE  USER  ADDRESS        METHOD',
  'local   all       all                  scram-sha-256',
  'host    all       all   127.0.0.1/32   scram-sha-256',
  '',
].join('\n');

/** The durable cluster's password: read from `file`, or generated there (mode 600) on first use. */
export function clusterSecret(file: string): string {
  if (existsSync(file)) {
    chmodSync(file, 0o600);
    const secret = readFileSync(file, 'utf8').trim();
    if (secret) return secret;
  }
  mkdirSync(path.dirname(file), { recursive: true });
  const secret = randomBytes(24).toString('hex');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  chmodSync(file, 0o600);
  return secret;
}

/**
 * Removes the throw-away settings from a cluster's postgresql.auto.conf (clusters that `npm start`
 * created before it kept durable defaults had them). Answers whether anything was removed.
 */
export function removeThrowawaySettings(dataDir: string): boolean {
  const file = path.join(dataDir, 'postgresql.auto.conf');
  if (!existsSync(file)) return false;
  const lines = readFileSync(file, 'utf8').split('\n');
  const kept = lines.filter((line) => !DURABILITY_KEYS.includes(line.split('=')[0]!.trim()));
  if (kept.length === lines.length) return false;
  writeFileSync(file, kept.join('\n'));
  return true;
}

/**
 * Start (creating on first use) a cluster with its data in `dataDir`, listening on 127.0.0.1:`port`
 * only. A durable cluster created by an older Laminote (no fsync, trusted connections) is corrected
 * here, at its next start.
 */
export async function startCluster(dataDir: string, port: number, log: (line: string) => void, options: ClusterOptions): Promise<Cluster> {
  const durable = options.mode === 'durable';
  if (durable && !options.secretFile) throw new Error('a durable cluster needs a secret file');
  const secret = durable ? clusterSecret(options.secretFile!) : null;
  const bin = ensurePostgresBinaries(log);
  if (isRoot()) ensureClusterUser();
  const runDir = path.join(path.dirname(dataDir), `${path.basename(dataDir)}-run`);
  for (const dir of [path.dirname(dataDir), dataDir, runDir]) mkdirSync(dir, { recursive: true });
  if (isRoot()) {
    execFileSync('chown', ['-R', `${CLUSTER_USER}:`, dataDir, runDir]);
    chmodSync(dataDir, 0o700);
    if (!reachable(dataDir)) {
      throw new Error(
        `The PostgreSQL user '${CLUSTER_USER}' cannot reach ${dataDir} (a parent folder is closed to other users). ` +
          'Move the checkout, or set LAMINOTE_DATA_DIR to a folder under /var/lib or /tmp.',
      );
    }
  }
  const ownByCluster = (file: string) => {
    if (isRoot()) execFileSync('chown', [`${CLUSTER_USER}:`, file]);
  };
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    log(`Creating a PostgreSQL cluster in ${dataDir} …`);
    const initdb = ['-D', dataDir, '-U', SUPERUSER, '--encoding=UTF8', '--locale=C', '--no-instructions'];
    if (secret) {
      // The password reaches initdb through a file only the cluster's owner can read, removed at once.
      const pwfile = path.join(runDir, 'initdb-password');
      writeFileSync(pwfile, `${secret}\n`, { mode: 0o600 });
      ownByCluster(pwfile);
      try {
        runAs(path.join(bin, 'initdb'), [...initdb, '--auth=scram-sha-256', `--pwfile=${pwfile}`]);
      } finally {
        rmSync(pwfile, { force: true });
      }
    } else runAs(path.join(bin, 'initdb'), [...initdb, '--auth=trust']);
    writeFileSync(
      path.join(dataDir, 'postgresql.auto.conf'),
      ["listen_addresses = '127.0.0.1'", `unix_socket_directories = '${runDir}'`, ...(durable ? [] : THROWAWAY_SETTINGS), ''].join('\n'),
      { flag: 'a' },
    );
    ownByCluster(path.join(dataDir, 'postgresql.auto.conf'));
    if (durable) {
      writeFileSync(path.join(dataDir, 'pg_hba.conf'), DURABLE_HBA);
      ownByCluster(path.join(dataDir, 'pg_hba.conf'));
    }
  }
  const ctl = path.join(bin, 'pg_ctl');
  let corrected = false;
  if (durable && removeThrowawaySettings(dataDir)) {
    log('Turning fsync, synchronous_commit and full_page_writes back on in the cluster (they were off) …');
    corrected = true;
  }
  const stop = () => {
    runAs(ctl, ['-D', dataDir, '-m', 'fast', '-w', 'stop'], { allowFail: true });
  };
  const isRunning = () => runAs(ctl, ['-D', dataDir, 'status'], { allowFail: true }).status === 0;
  const start = () => {
    runAs(ctl, ['-D', dataDir, '-l', path.join(runDir, 'postgres.log'), '-o', `-p ${port} -h 127.0.0.1`, '-w', '-t', '60', 'start']);
  };
  if (!isRunning()) {
    log(`Starting PostgreSQL on 127.0.0.1:${port} …`);
    // From here on the cluster is ours to stop: a signal while pg_ctl waits must not leave it behind.
    pendingStop = stop;
    start();
  } else if (corrected) {
    runAs(ctl, ['-D', dataDir, 'reload']);
  }
  const url = (database: string) => `postgres://${SUPERUSER}${secret ? `:${secret}` : ''}@127.0.0.1:${port}/${database}`;
  if (durable && readFileSync(path.join(dataDir, 'pg_hba.conf'), 'utf8') !== DURABLE_HBA) {
    // A cluster from before password authentication: give the superuser the password while
    // connections are still trusted, then require it.
    log('Requiring a password for connections to the cluster (it trusted every local user) …');
    const client = new pg.Client({ connectionString: url('postgres') });
    await client.connect();
    try {
      await client.query(`alter role ${SUPERUSER} with password '${secret!}'`);
    } finally {
      await client.end();
    }
    writeFileSync(path.join(dataDir, 'pg_hba.conf'), DURABLE_HBA);
    ownByCluster(path.join(dataDir, 'pg_hba.conf'));
    runAs(ctl, ['-D', dataDir, 'reload']);
  }
  pendingStop = null;
  return { url, port, stop, isRunning, restart: start };
}

/**
 * The stop of a cluster whose start is under way (pg_ctl is still waiting for it), so a signal handler
 * can stop it before startCluster returns.
 */
let pendingStop: (() => void) | null = null;
export function stopClusterBeingStarted(): void {
  pendingStop?.();
  pendingStop = null;
}

/** Create a database if it does not exist yet. */
export async function ensureDatabase(serverUrl: string, name: string, opts: { recreate?: boolean } = {}): Promise<void> {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`bad database name ${name}`);
  const client = new pg.Client({ connectionString: serverUrl });
  await client.connect();
  try {
    if (opts.recreate) await client.query(`drop database if exists ${name} with (force)`);
    const { rowCount } = await client.query('select 1 from pg_database where datname = $1', [name]);
    if (!rowCount) await client.query(`create database ${name}`);
  } finally {
    await client.end();
  }
}
