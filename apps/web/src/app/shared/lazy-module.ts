import { type Signal, signal } from '@angular/core';

/** A module the first screen does without, fetched once when something first needs it. */
export interface LazyModule<T> {
  /** The module once it is here (a signal, so what reads it updates when it arrives); null before. */
  readonly module: Signal<T | null>;
  /** Fetches it (once); a failed fetch (offline) is tried again by the next call. */
  load(): Promise<T>;
  /**
   * The same, once the browser is next idle (at most a second later): for what a screen shows beside
   * its first drawing, so the module is fetched and run after that drawing rather than inside it.
   */
  loadWhenIdle(): Promise<T>;
}

/** Resolves when the browser is next idle (at most `timeout` ms later); a timer where it cannot tell. */
export function whenIdle(timeout = 1000): Promise<void> {
  return new Promise((resolve) => (typeof requestIdleCallback === 'function' ? requestIdleCallback(() => resolve(), { timeout }) : setTimeout(resolve, 0)));
}

/** Wraps a dynamic `import()` so the bundler splits the module off and screens can wait for it. */
export function lazyModule<T>(fetch: () => Promise<T>): LazyModule<T> {
  const loaded = signal<T | null>(null);
  let loading: Promise<T> | null = null;
  const load = (): Promise<T> => {
    loading ??= fetch().then(
      (module) => {
        loaded.set(module);
        return module;
      },
      (error: unknown) => {
        loading = null;
        throw error;
      },
    );
    return loading;
  };
  return {
    module: loaded.asReadonly(),
    load,
    loadWhenIdle: () => (loading ?? whenIdle().then(load)),
  };
}
