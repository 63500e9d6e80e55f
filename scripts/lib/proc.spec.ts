import { describe, expect, it } from 'vitest';
import { restartDelayMs, startService, supervise } from './proc';

describe('supervise', () => {
  it('doubles the delay after each crash in a row, up to the cap', () => {
    expect([1, 2, 3, 4, 5, 6, 7].map((n) => restartDelayMs(n, 1000, 30_000))).toEqual([1000, 2000, 4000, 8000, 16_000, 30_000, 30_000]);
  });

  it('starts a crashed service again, logs it, and gives up after the crashes allowed', async () => {
    const lines: string[] = [];
    let launches = 0;
    const gaveUp = new Promise<string>((resolve) => {
      supervise(
        'crasher',
        () => {
          launches++;
          return startService('crasher', process.execPath, ['-e', 'process.exit(3)'], {}, { quiet: true });
        },
        { log: (line) => lines.push(line), onGiveUp: resolve, baseDelayMs: 20, maxDelayMs: 40, maxCrashes: 3 },
      );
    });
    expect(await gaveUp).toBe('crasher');
    // The first start and three restarts; the fourth crash is one too many.
    expect(launches).toBe(4);
    expect(lines.filter((l) => l.includes('starting it again in'))).toHaveLength(3);
    expect(lines.at(-1)).toMatch(/4 times in a row; not starting it again/);
  });

  it('does not start a service again once it is being stopped', async () => {
    let launches = 0;
    const s = supervise('sleeper', () => {
      launches++;
      return startService('sleeper', process.execPath, ['-e', 'setTimeout(() => {}, 60000)'], {}, { quiet: true });
    }, { log: () => undefined, onGiveUp: () => undefined, baseDelayMs: 10 });
    await new Promise((r) => setTimeout(r, 200));
    await s.stop();
    await new Promise((r) => setTimeout(r, 100));
    expect(launches).toBe(1);
    expect(s.current().child.exitCode !== null || s.current().child.signalCode !== null).toBe(true);
  });
});
