import { lazyModule } from './lazy-module';

export type RuntimeChecks = typeof import('./runtime-schemas');

/**
 * The contract schemas the notebook checks with (`runtime-schemas.ts`), fetched once, apart from the
 * first screen. Whatever needs them waits for them: a cell's form stays read-only and the add-cell
 * menu's kinds disabled until they are here, so nothing typed looks valid before it has been checked.
 */
const checks = lazyModule(() => import('./runtime-schemas'));

export const loadRuntimeChecks = checks.load;

/** The schemas once loaded (a signal); null before. */
export const runtimeChecks = checks.module;
