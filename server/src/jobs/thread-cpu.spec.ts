import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { threadCpuMs } from './thread-cpu';

const processCpuMs = () => {
  const used = process.cpuUsage();
  return (used.user + used.system) / 1000;
};

describe('threadCpuMs', () => {
  it.runIf(process.platform === 'linux')("counts this thread only: another thread spinning meanwhile is the process's time, not ours", async () => {
    const [thread, proc] = [threadCpuMs(), processCpuMs()];
    // A second thread spins for 200 ms of CPU time (the process's, this thread only waiting meanwhile).
    const spinner = new Worker(
      `const cpu = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
       const start = cpu();
       while (cpu() - start < 200) {}`,
      { eval: true },
    );
    await new Promise((resolve) => spinner.once('exit', resolve));
    const ownMs = threadCpuMs() - thread;
    const processMs = processCpuMs() - proc;
    expect(processMs - ownMs).toBeGreaterThan(100);
    expect(ownMs).toBeLessThan(processMs);
  });

  it('grows by about what this thread computes', () => {
    const [thread, proc] = [threadCpuMs(), processCpuMs()];
    let x = 0;
    for (let i = 0; i < 3e7; i++) x += Math.sqrt(i);
    const ownMs = threadCpuMs() - thread;
    const processMs = processCpuMs() - proc;
    expect(x).toBeGreaterThan(0);
    expect(ownMs).toBeGreaterThan(0.5 * processMs);
    expect(ownMs).toBeLessThanOrEqual(processMs + 5);
  });
});
