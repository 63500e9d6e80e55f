import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';

/** Child processes of the start and test commands, with their output prefixed and a clean stop. */
export interface Service {
  name: string;
  child: ChildProcess;
  stop: () => Promise<void>;
}

export function startService(name: string, command: string, args: string[], env: NodeJS.ProcessEnv, opts: { quiet?: boolean } = {}): Service {
  const child = spawn(command, args, { env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  const prefix = (chunk: Buffer, stream: NodeJS.WriteStream) => {
    if (opts.quiet) return;
    for (const line of chunk.toString().split('\n')) if (line.trim()) stream.write(`[${name}] ${line}\n`);
  };
  child.stdout?.on('data', (c: Buffer) => prefix(c, process.stdout));
  child.stderr?.on('data', (c: Buffer) => prefix(c, process.stderr));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  return {
    name,
    child,
    stop: async () => {
      if (child.exitCode !== null || child.signalCode !== null) return;
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 8000);
      await exited;
      clearTimeout(timer);
    },
  };
}

/** Wait until something accepts connections on host:port, or the child exits, or time runs out. */
export async function waitForPort(host: string, port: number, timeoutMs = 60_000, child?: ChildProcess): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child && child.exitCode !== null) throw new Error(`process exited (code ${child.exitCode}) before listening on ${host}:${port}`);
    const ok = await new Promise<boolean>((resolve) => {
      const socket = net.connect(port, host);
      socket.once('connect', () => {
        socket.destroy();
        resolve(true);
      });
      socket.once('error', () => resolve(false));
    });
    if (ok) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`nothing listened on ${host}:${port} within ${timeoutMs / 1000} s`);
}

export async function portIsFree(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.listen(port, host, () => server.close(() => resolve(true)));
  });
}

/** A free TCP port on loopback, for throw-away services in tests. */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

export interface SupervisorOptions {
  /** Called with each line worth telling the operator (restarts, giving up). */
  log: (line: string) => void;
  /** Called once when the service keeps crashing and is not started again. */
  onGiveUp: (service: string) => void;
  /** First delay before a restart; doubles after each crash, up to maxDelayMs. */
  baseDelayMs?: number;
  maxDelayMs?: number;
  /** A run that lasted this long counts as healthy: the back-off starts over. */
  healthyAfterMs?: number;
  /** Crashes in a row (without a healthy run between them) before giving up. */
  maxCrashes?: number;
}

export interface Supervised {
  name: string;
  /** The current process. */
  current(): Service;
  /** How many times it was started again after a crash. */
  restarts(): number;
  stop(): Promise<void>;
}

/** The delay before restart number `crashes` (1-based): base · 2^(crashes−1), capped. */
export function restartDelayMs(crashes: number, baseDelayMs: number, maxDelayMs: number): number {
  return Math.min(maxDelayMs, baseDelayMs * 2 ** Math.max(0, crashes - 1));
}

/**
 * Keeps a service running: when it exits on its own, it is started again after a back-off delay and
 * the restart is logged; after `maxCrashes` crashes in a row it is given up (onGiveUp).
 */
export function supervise(name: string, launch: () => Service, options: SupervisorOptions): Supervised {
  const { log, onGiveUp, baseDelayMs = 1000, maxDelayMs = 30_000, healthyAfterMs = 60_000, maxCrashes = 6 } = options;
  let service = launch();
  let stopping = false;
  let crashes = 0;
  let restarts = 0;
  let timer: NodeJS.Timeout | null = null;
  const watch = (s: Service) => {
    const startedAt = Date.now();
    s.child.once('exit', (code, signal) => {
      if (stopping) return;
      crashes = Date.now() - startedAt >= healthyAfterMs ? 1 : crashes + 1;
      const how = signal ? `signal ${signal}` : `exit ${code}`;
      if (crashes > maxCrashes) {
        log(`${name} stopped (${how}) ${crashes} times in a row; not starting it again`);
        onGiveUp(name);
        return;
      }
      const delay = restartDelayMs(crashes, baseDelayMs, maxDelayMs);
      log(`${name} stopped unexpectedly (${how}); starting it again in ${(delay / 1000).toFixed(1)} s`);
      timer = setTimeout(() => {
        timer = null;
        if (stopping) return;
        restarts++;
        service = launch();
        watch(service);
      }, delay);
    });
  };
  watch(service);
  return {
    name,
    current: () => service,
    restarts: () => restarts,
    async stop() {
      stopping = true;
      if (timer) clearTimeout(timer);
      await service.stop();
    },
  };
}
