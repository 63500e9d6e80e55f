import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, readdirSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { NG, ROOT, WEB_DIST } from './paths';

/**
 * Builds the web app (`ng build web` with WEB_BUILD_ENV) and then names main by its content and, in
 * index.html, the code a first screen needs so the browser asks for it at once (`finishWebBuild`).
 * Returns whether the build succeeded.
 */
export function buildWeb(env: NodeJS.ProcessEnv = process.env): boolean {
  const build = spawnSync(NG, ['build', 'web'], { cwd: ROOT, stdio: 'inherit', env: { ...env, ...WEB_BUILD_ENV } });
  if (build.status !== 0) return false;
  finishWebBuild(WEB_DIST);
  return true;
}

/**
 * What every build of the web app runs with. Angular's chunk optimizer (NG_BUILD_OPTIMIZE_CHUNKS, rolldown
 * over esbuild's output) merges the many small shared chunks esbuild splits the code into at each lazy
 * import: the first screen of a study went from 63 scripts to 38 (issue 15; a cold open fetches them over
 * six HTTP/1.1 connections), and to 2 once the notebook page came with main (app-routes.ts). It also
 * merges the chunks of each page and body fetched on first use.
 */
export const WEB_BUILD_ENV: Readonly<Record<string, string>> = { NG_BUILD_OPTIMIZE_CHUNKS: '1' };

/** After `ng build web`: main named by its content, then the first screens' code named in index.html. */
export function finishWebBuild(dist: string): void {
  nameMainByContent(dist);
  addPreloads(dist);
}

/**
 * Renames main-*.js after a hash of what it holds, rewriting the scripts that import it and index.html.
 * esbuild names main before the chunk optimizer rewrites it, so the same sources built with and without
 * the optimizer give two different files of one name; browsers keep the app's hashed files a year
 * without asking again. Chunks keep their names: each one's already covers its own code and main's
 * esbuild name. Running it again changes nothing.
 */
export function nameMainByContent(dist: string): string {
  const indexFile = path.join(dist, 'index.html');
  const html = readFileSync(indexFile, 'utf8');
  const current = /<script src="(main-[\w-]+)\.js" type="module">/.exec(html)?.[1];
  if (!current) throw new Error(`${indexFile} names no main script`);
  const text = readFileSync(path.join(dist, `${current}.js`));
  const named = `main-${base32(createHash('sha256').update(text).digest()).slice(0, 8)}`;
  if (named === current) return `${named}.js`;
  renameSync(path.join(dist, `${current}.js`), path.join(dist, `${named}.js`));
  if (existsSync(path.join(dist, `${current}.js.map`))) renameSync(path.join(dist, `${current}.js.map`), path.join(dist, `${named}.js.map`));
  for (const file of readdirSync(dist).filter((f) => f.endsWith('.js') || f.endsWith('.js.map') || f === 'index.html')) {
    const before = readFileSync(path.join(dist, file), 'utf8');
    const after = before.replaceAll(`${current}.js`, `${named}.js`);
    if (after !== before) writeFileSync(path.join(dist, file), after);
  }
  return `${named}.js`;
}

/** RFC 4648 base 32 (A–Z, 2–7), the alphabet of esbuild's hashes. */
function base32(bytes: Uint8Array): string {
  const alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ234567';
  let out = '';
  let bits = 0;
  let value = 0;
  for (const byte of bytes) {
    value = (value << 8) | byte;
    bits += 8;
    while (bits >= 5) {
      out += alphabet[(value >>> (bits - 5)) & 31];
      bits -= 5;
    }
  }
  return out;
}

/** The built scripts a built script imports statically (esbuild's output: `import … from "./chunk-X.js"`). */
export const staticImportsOf = (text: string): string[] => [...text.matchAll(/(?:import|export)\s*(?:[\w$*{},\s]*from\s*)?["']\.\/([\w-]+\.js)["']/g)].map((m) => m[1]!);

/** Each built script and the scripts it imports statically (what the browser fetches before it runs it). */
function staticImports(dist: string): Map<string, { text: string; imports: string[] }> {
  const scripts = new Map<string, { text: string; imports: string[] }>();
  for (const file of readdirSync(dist).filter((f) => f.endsWith('.js'))) {
    const text = readFileSync(path.join(dist, file), 'utf8');
    scripts.set(file, { text, imports: staticImportsOf(text) });
  }
  return scripts;
}

/** The scripts `roots` bring in by static imports, themselves included, leaving out `without` (and what only they import). */
export function closure(scripts: ReadonlyMap<string, { imports: readonly string[] }>, roots: Iterable<string>, without: ReadonlySet<string> = new Set()): string[] {
  const seen = new Set<string>();
  const visit = (file: string) => {
    if (seen.has(file) || without.has(file) || !scripts.has(file)) return;
    seen.add(file);
    for (const next of scripts.get(file)!.imports) visit(next);
  };
  for (const root of roots) visit(root);
  return [...seen];
}

/**
 * A cell body's component, by the stem of its selector (as the compiler writes it, in double quotes, or in
 * backquotes once the chunk optimizer has rewritten it).
 */
const KIND_ROOT = /selectors:\[\[(["`])lam-([a-z-]+)-cell\1\]\]/g;

/**
 * Without these hints a cold open fetches its code in rounds, one per level of imports: Angular's build
 * names at most 10 of the initial scripts in index.html (main's own imports beyond them are found when
 * main arrives). Here index.html gets a modulepreload link for every script main imports (the notebook
 * page comes with main: app-routes.ts), and the list of the scripts of each cell kind fetched on first
 * use, which early-reads.js asks for once the draft says which kinds the study has. Running it again
 * changes nothing.
 */
export function addPreloads(dist: string): { initial: string[]; kinds: Record<string, string[]> } {
  const indexFile = path.join(dist, 'index.html');
  let html = readFileSync(indexFile, 'utf8');
  const scripts = staticImports(dist);
  const entries = [...html.matchAll(/<script src="([\w-]+\.js)"[^>]*>/g)].map((m) => m[1]!);
  const initial = closure(scripts, entries);
  const initialSet = new Set(initial);
  // The bodies fetched on first use (CELL_BODIES' LoadedBody): each kind's scripts beyond main's, by the
  // stem of its selector (lam-leading-edge-cell: "leading-edge").
  const kinds: Record<string, string[]> = {};
  for (const [file, script] of scripts) {
    if (initialSet.has(file)) continue;
    for (const m of script.text.matchAll(KIND_ROOT)) kinds[m[2]!] = closure(scripts, [file], initialSet);
  }

  const linked = new Set([...html.matchAll(/<link rel="modulepreload" href="([\w-]+\.js)"/g)].map((m) => m[1]!));
  const links = initial.filter((file) => !linked.has(file) && !entries.includes(file)).map((file) => `<link rel="modulepreload" href="${file}">`);
  const list = `<script type="application/json" id="lam-kind-code">${JSON.stringify(kinds)}</script>`;
  html = html.replace(/<script type="application\/json" id="lam-kind-code">.*?<\/script>/g, '');
  // The global scripts bundle (early-reads.js) goes into the head, after the style sheet and the list it
  // reads, as a plain script rather than Angular's deferred one at the end of the body: it then runs as
  // soon as the style sheet has loaded, and the first reads leave before the scripts the body names (a
  // deferred script runs once the body is parsed, and is fetched at low priority behind them).
  const global = /<script src="(scripts-[\w-]+\.js)"(?: defer)?><\/script>/.exec(html);
  if (global) {
    html = html.replace(global[0], '');
    const head = html.indexOf('</head>');
    if (head < 0) throw new Error(`${indexFile} has no head`);
    html = `${html.slice(0, head)}${list}<script src="${global[1]}"></script>${html.slice(head)}`;
  }
  // Angular's own links and these, before the app's script.
  const firstScript = html.indexOf('<script src="', html.indexOf('<body'));
  if (firstScript < 0) throw new Error(`${indexFile} names no script`);
  html = `${html.slice(0, firstScript)}${links.join('')}${global ? '' : list}${html.slice(firstScript)}`;
  html = addFontPreloads(dist, html);
  writeFileSync(indexFile, html);
  return { initial, kinds };
}

/**
 * The fonts every study's first screen draws with (Lato regular and bold, JetBrains Mono and the icon
 * subset, latin only), by the stem of their built names in media/. Without a hint the browser asks for
 * each font only once the page's text needs it: JetBrains Mono, which the cells' figures use, arrived
 * after the first drawing and laid the page out again inside the first keystroke (33 ms, traced). A/B,
 * 8 + 8 cold opens, twice: median 1016 → 954 ms and 1186 → 1034 ms.
 */
const FIRST_SCREEN_FONTS = ['lato-latin-400-normal', 'lato-latin-700-normal', 'jetbrains-mono-latin-400-normal', 'symbols'];

function addFontPreloads(dist: string, page: string): string {
  const media = path.join(dist, 'media');
  const files = existsSync(media) ? readdirSync(media) : [];
  const links = FIRST_SCREEN_FONTS.flatMap((stem) => files.filter((f) => new RegExp(`^${stem}-[\\w-]+\\.woff2$`).test(f)).slice(0, 1)).map(
    (file) => `<link rel="preload" href="media/${file}" as="font" type="font/woff2" crossorigin>`,
  );
  const html = page.replace(/<link rel="preload" href="media\/[^"]+" as="font" type="font\/woff2" crossorigin>/g, '');
  const sheet = html.indexOf('<link rel="stylesheet"');
  const at = sheet >= 0 ? sheet : html.indexOf('</head>');
  if (at < 0) throw new Error('index.html has no head');
  return `${html.slice(0, at)}${links.join('')}${html.slice(at)}`;
}
