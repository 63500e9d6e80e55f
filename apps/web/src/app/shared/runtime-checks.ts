import { InjectionToken } from '@angular/core';
import { type LazyModule, lazyModule } from './lazy-module';

export type RuntimeChecks = typeof import('./runtime-schemas');

/**
 * The contract schemas the notebook checks with (`runtime-schemas.ts`), fetched once, apart from the
 * first screen. Whatever needs them waits for them: a cell's form stays read-only and the add-cell
 * menu's kinds disabled until they are here, so nothing typed looks valid before it has been checked.
 */
const checks = lazyModule(() => import('./runtime-schemas'));

export const loadRuntimeChecks = checks.load;

/**
 * The same, once the browser is next idle: how what a first screen draws asks for them. zod is 470 kB of
 * script to run, and its first checks of the screen's cells took about as long again, inside the
 * drawing of the first screen; now a form waits read-only for that idle moment instead.
 */
export const loadRuntimeChecksWhenIdle = checks.loadWhenIdle;

/** The schemas once loaded (a signal); null before. */
export const runtimeChecks = checks.module;

/** The same loader, injected where a test gives its own (one whose module comes when the test says). */
export const RUNTIME_CHECKS = new InjectionToken<LazyModule<RuntimeChecks>>('runtime checks', { providedIn: 'root', factory: () => checks });
