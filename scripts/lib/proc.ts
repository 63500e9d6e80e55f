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
