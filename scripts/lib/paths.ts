import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const DATA_DIR = process.env['LAMINOTE_DATA_DIR'] ? path.resolve(process.env['LAMINOTE_DATA_DIR']) : path.join(ROOT, '.data');
export const WEB_DIST = path.join(ROOT, 'dist/web/browser');
export const TSX = path.join(ROOT, 'node_modules/.bin/tsx');
export const NG = path.join(ROOT, 'node_modules/.bin/ng');
export const VITEST = path.join(ROOT, 'node_modules/.bin/vitest');

/** Newest modification time of any file under the given paths (skipping node_modules and what `skip` names). */
export function newestMtime(paths: string[], skip: (entry: string) => boolean = () => false): number {
  let newest = 0;
  const walk = (p: string) => {
    if (!existsSync(p)) return;
    const s = statSync(p);
    if (s.isDirectory()) {
      for (const entry of readdirSync(p)) if (entry !== 'node_modules' && !skip(entry)) walk(path.join(p, entry));
    } else newest = Math.max(newest, s.mtimeMs);
  };
  for (const p of paths) walk(path.join(ROOT, p));
  return newest;
}

/**
 * The web build is current when its index.html is newer than every source it is built from. Benchmarks
 * and unit tests are not built into the app: editing one does not make the build stale.
 */
export function webBuildIsCurrent(): boolean {
  const index = path.join(WEB_DIST, 'index.html');
  if (!existsSync(index)) return false;
  const notBuilt = (entry: string) => entry === 'bench' || entry.endsWith('.spec.ts');
  return statSync(index).mtimeMs >= newestMtime(['apps/web', 'libs/contracts', 'libs/aero/src', 'angular.json', 'package-lock.json'], notBuilt);
}
