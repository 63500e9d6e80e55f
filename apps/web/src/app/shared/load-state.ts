import { type Signal, computed, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { Problem } from '@laminote/contracts';
import { type Observable, type OperatorFunction, catchError, map, of, scan, startWith, switchMap } from 'rxjs';
import { toProblem } from '../core/problem';

/** What a screen knows about data it asked for. A reload keeps the last value on screen while it runs. */
export interface LoadState<T> {
  readonly value: T | undefined;
  readonly loading: boolean;
  readonly problem: Problem | null;
}

export const LOADING: LoadState<never> = { value: undefined, loading: true, problem: null };

type LoadEvent<T> = { kind: 'start' } | { kind: 'value'; value: T } | { kind: 'error'; problem: Problem };

/**
 * Turns a stream of requests (one per route parameter, filter or refresh) into load states. A newer
 * request cancels an older one still in flight, so a slow answer never overwrites a newer one.
 */
export function trackLoad<T>(): OperatorFunction<Observable<T>, LoadState<T>> {
  return (requests) =>
    requests.pipe(
      switchMap((request) =>
        request.pipe(
          map((value): LoadEvent<T> => ({ kind: 'value', value })),
          catchError((error: unknown) => of<LoadEvent<T>>({ kind: 'error', problem: toProblem(error) })),
          startWith<LoadEvent<T>>({ kind: 'start' }),
        ),
      ),
      scan((state: LoadState<T>, event: LoadEvent<T>): LoadState<T> => {
        switch (event.kind) {
          case 'start':
            return { ...state, loading: true };
          case 'value':
            return { value: event.value, loading: false, problem: null };
          case 'error':
            return { ...state, loading: false, problem: event.problem };
        }
      }, LOADING),
    );
}

/** A load that follows its parameters and can be run again on demand. */
export interface Loader<T> {
  readonly state: Signal<LoadState<T>>;
  reload(): void;
}

/**
 * Loads with `load(params())` whenever the parameters change or `reload()` is called. Call it in an
 * injection context (a field initialiser); the request is cancelled when the component goes away.
 */
export function loader<P, T>(params: () => P, load: (params: P) => Observable<T>): Loader<T> {
  const refresh = signal(0);
  const requests = toObservable(computed(() => ({ params: params(), refresh: refresh() }))).pipe(
    map(({ params }) => load(params)),
  );
  return {
    state: toSignal(requests.pipe(trackLoad<T>()), { initialValue: LOADING }),
    reload: () => refresh.update((n) => n + 1),
  };
}
