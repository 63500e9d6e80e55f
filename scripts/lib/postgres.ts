import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
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
 * Start (creating on first use) a cluster with its data in `dataDir`, listening on 127.0.0.1:`port`
 * only, with local connections trusted (loopback, development and tests only).
 */
export async function startCluster(dataDir: string, port: number, log: (line: string) => void): Promise<Cluster> {
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
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    log(`Creating a PostgreSQL cluster in ${dataDir} …`);
    runAs(path.join(bin, 'initdb'), ['-D', dataDir, '-U', SUPERUSER, '--auth=trust', '--encoding=UTF8', '--locale=C', '--no-instructions']);
    writeFileSync(
      path.join(dataDir, 'postgresql.auto.conf'),
      ["listen_addresses = '127.0.0.1'", `unix_socket_directories = '${runDir}'`, 'fsync = off', 'synchronous_commit = off', 'full_page_writes = off', ''].join('\n'),
      { flag: 'a' },
    );
    if (isRoot()) execFileSync('chown', [`${CLUSTER_USER}:`, path.join(dataDir, 'postgresql.auto.conf')]);
  }
  const ctl = path.join(bin, 'pg_ctl');
  const status = runAs(ctl, ['-D', dataDir, 'status'], { allowFail: true });
  if (status.status !== 0) {
    log(`Starting PostgreSQL on 127.0.0.1:${port} …`);
    runAs(ctl, ['-D', dataDir, '-l', path.join(runDir, 'postgres.log'), '-o', `-p ${port} -h 127.0.0.1`, '-w', '-t', '60', 'start']);
  }
  const url = (database: string) => `postgres://${SUPERUSER}@127.0.0.1:${port}/${database}`;
  return {
    url,
    port,
    stop: () => {
      runAs(ctl, ['-D', dataDir, '-m', 'fast', '-w', 'stop'], { allowFail: true });
    },
  };
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
