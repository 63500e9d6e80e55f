import { type Signal, signal } from '@angular/core';

/** A module the first screen does without, fetched once when something first needs it. */
export interface LazyModule<T> {
  /** The module once it is here (a signal, so what reads it updates when it arrives); null before. */
  readonly module: Signal<T | null>;
  /** Fetches it (once); a failed fetch (offline) is tried again by the next call. */
  load(): Promise<T>;
}

/** Wraps a dynamic `import()` so the bundler splits the module off and screens can wait for it. */
export function lazyModule<T>(fetch: () => Promise<T>): LazyModule<T> {
  const loaded = signal<T | null>(null);
  let loading: Promise<T> | null = null;
  return {
    module: loaded.asReadonly(),
    load: () => {
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
    },
  };
}
