import { readFileSync, statSync } from 'node:fs';
import path from 'node:path';

/**
 * index.html for a study's address, with the notebook's code named up front (issue 15, cold opens).
 *
 * The notebook page and each cell kind's body are lazy chunks that import shared chunks, which import
 * more: fetched from the page alone, they arrive in rounds, one per level of imports, each round only
 * once the one before has been read. With a `<link rel="modulepreload">` per file in index.html the
 * browser asks for all of them right after the app's first files, in one round. Preloading fetches and
 * compiles; nothing runs before the app imports it, so nothing changes but when the bytes arrive.
 *
 * Which files those are comes from the build's own record of its chunks (`stats.json`, the esbuild
 * metafile the production build writes beside `browser/`): the chunks built from the entry points
 * below and every chunk they import statically, less those index.html already names. Without the
 * record (a development build) index.html goes out as it is.
 */

/** The notebook's entry points, as the app fetches them on a study's address (notebook/prefetch.ts). */
const STUDY_ENTRY_POINTS = [
  /^apps\/web\/src\/app\/notebook\/notebook-page\.ts$/,
  /^apps\/web\/src\/app\/notebook\/[\w-]+\/[\w-]+-cell\.ts$/,
  /^apps\/web\/src\/app\/shared\/runtime-schemas\.ts$/,
];

export const STUDY_PAGE = /^\/studies\/[^/]+\/?$/;

interface Metafile {
  outputs: Record<string, { entryPoint?: string; imports?: { path: string; kind: string }[] }>;
}

/** The files to preload for a study's page, in the order a breadth-first walk from the entries meets them. */
export function studyPreloads(metafile: Metafile, indexHtml: string): string[] {
  const named = new Set([...indexHtml.matchAll(/(?:src|href)="([^"]+\.js)"/g)].map((m) => m[1]!));
  const queue = Object.entries(metafile.outputs)
    .filter(([file, out]) => file.endsWith('.js') && out.entryPoint !== undefined && STUDY_ENTRY_POINTS.some((p) => p.test(out.entryPoint!)))
    .map(([file]) => file);
  const seen = new Set<string>();
  for (let i = 0; i < queue.length; i++) {
    const file = queue[i]!;
    if (seen.has(file)) continue;
    seen.add(file);
    for (const dep of metafile.outputs[file]?.imports ?? []) if (dep.kind === 'import-statement' && !seen.has(dep.path)) queue.push(dep.path);
  }
  return [...seen].filter((f) => !named.has(f) && /^[\w.-]+\.js$/.test(f));
}

/**
 * index.html for a study's address: the built one with the preload links at the end of `<body>`. Read again
 * when the build changes (by the files' modification times), so a rebuild under a running server is
 * served as built.
 */
export function studyIndexHtml(webDir: string): () => string | null {
  const indexFile = path.join(webDir, 'index.html');
  const statsFile = path.join(webDir, '..', 'stats.json');
  let cached: { key: string; html: string | null } | null = null;
  return () => {
    let key: string;
    try {
      key = `${statSync(indexFile).mtimeMs}:${statSync(statsFile).mtimeMs}`;
    } catch {
      return null;
    }
    if (cached?.key !== key) {
      let html: string | null = null;
      try {
        const index = readFileSync(indexFile, 'utf8');
        const files = studyPreloads(JSON.parse(readFileSync(statsFile, 'utf8')) as Metafile, index);
        // After the app's own scripts and at low priority: over HTTP/1.1 a browser has six connections
        // to the server, and the sign-in check, the study's reads (early-reads.js) and the app's entry
        // must not queue behind seventy chunks that are needed only once the app has started.
        const links = files.map((f) => `<link rel="modulepreload" href="${f}" fetchpriority="low">`).join('');
        html = files.length && index.includes('</body>') ? index.replace('</body>', `${links}</body>`) : null;
      } catch {
        // An unreadable or half-written record: the page as built, and a fresh try next time.
        return null;
      }
      cached = { key, html };
    }
    return cached.html;
  };
}
