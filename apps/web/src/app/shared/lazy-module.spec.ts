import { afterEach, describe, expect, it, vi } from 'vitest';
import { lazyModule } from './lazy-module';

describe('lazyModule', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('fetches when idle only once the browser says it is idle, then once for every caller', async () => {
    const idle: (() => void)[] = [];
    vi.stubGlobal('requestIdleCallback', (run: () => void, options?: { timeout?: number }) => {
      expect(options?.timeout).toBeGreaterThan(0);
      idle.push(run);
      return idle.length;
    });
    const fetch = vi.fn(() => Promise.resolve({ answer: 42 }));
    const lazy = lazyModule(fetch);
    const first = lazy.loadWhenIdle();
    await Promise.resolve();
    expect(fetch).not.toHaveBeenCalled();
    expect(lazy.module()).toBeNull();
    idle.shift()!();
    expect(await first).toEqual({ answer: 42 });
    expect(lazy.module()).toEqual({ answer: 42 });
    // Loaded (or loading): no further wait, no second fetch, whichever way it is asked for.
    expect(await lazy.loadWhenIdle()).toEqual({ answer: 42 });
    expect(await lazy.load()).toEqual({ answer: 42 });
    expect(idle).toHaveLength(0);
    expect(fetch).toHaveBeenCalledTimes(1);
  });

  it('fetches at once when asked to outright, while a wait for idle is pending', async () => {
    vi.stubGlobal('requestIdleCallback', () => 1);
    const fetch = vi.fn(() => Promise.resolve('module'));
    const lazy = lazyModule(fetch);
    void lazy.loadWhenIdle();
    expect(await lazy.load()).toBe('module');
    expect(fetch).toHaveBeenCalledTimes(1);
  });

  it('falls back to a timer where the browser cannot say when it is idle, and tries a failed fetch again', async () => {
    vi.stubGlobal('requestIdleCallback', undefined);
    vi.useFakeTimers();
    const fetch = vi.fn().mockRejectedValueOnce(new Error('offline')).mockResolvedValue('module');
    const lazy = lazyModule(fetch);
    const failed = lazy.loadWhenIdle();
    const settled = failed.catch((error: Error) => error.message);
    expect(fetch).not.toHaveBeenCalled();
    await vi.runAllTimersAsync();
    expect(await settled).toBe('offline');
    expect(lazy.module()).toBeNull();
    const again = lazy.loadWhenIdle();
    await vi.runAllTimersAsync();
    expect(await again).toBe('module');
    expect(fetch).toHaveBeenCalledTimes(2);
  });
});
