import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { addPreloads, finishWebBuild, nameMainByContent } from './web-build';

const made: string[] = [];
afterEach(() => {
  for (const dir of made.splice(0)) rmSync(dir, { recursive: true, force: true });
});
function tempDir(): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'web-build-'));
  made.push(dir);
  return dir;
}

/**
 * A built app in the shape esbuild writes it: main imports two chunks, one of which imports a third, and
 * the notebook page, which comes with main.
 */
function builtApp(): string {
  const dist = tempDir();
  const files: Record<string, string> = {
    'main-M.js': 'import{a as x}from"./chunk-A.js";import"./chunk-B.js";import{p}from"./chunk-P.js";',
    'chunk-A.js': 'import{c}from"./chunk-C.js";export{c as a};',
    'chunk-B.js': 'export const b=1;',
    'chunk-C.js': 'export const c=1;',
    // The notebook page with a cell body it draws itself, a chunk of its own and one shared with main.
    'chunk-P.js':
      'import{d}from"./chunk-D.js";import{a}from"./chunk-A.js";import{f}from"./chunk-F.js";var s={selectors:[["lam-notebook-page"]]};const p=()=>import("./chunk-L.js");const q=()=>import("./chunk-Q.js");',
    'chunk-F.js': 'import{d}from"./chunk-D.js";var s={selectors:[["lam-flow-cell"]]};export const f=1;',
    'chunk-D.js': 'export const d=1;',
    // A body fetched on first use (the leading edge), with a chunk of its own beside the page's.
    'chunk-Q.js': 'import{d}from"./chunk-D.js";import{e}from"./chunk-E.js";var s={selectors:[["lam-leading-edge-cell"]]};',
    'chunk-E.js': 'export const e=1;',
    // A lazy chunk only a body imports dynamically (the plots): not listed.
    'chunk-L.js': 'export const plot=1;',
    'scripts-S.js': '(function(){})();',
  };
  for (const [file, text] of Object.entries(files)) writeFileSync(path.join(dist, file), text);
  writeFileSync(
    path.join(dist, 'index.html'),
    '<!doctype html><html><head><title>t</title></head><body><lam-root></lam-root><link rel="modulepreload" href="chunk-A.js"><script src="scripts-S.js" defer></script><script src="main-M.js" type="module"></script></body></html>',
  );
  return dist;
}

describe('addPreloads', () => {
  it('names every script main imports and lists each lazily fetched kind’s scripts beyond them, once however often it runs', () => {
    const dir = builtApp();
    const result = addPreloads(dir);
    expect(new Set(result.initial)).toEqual(new Set(['scripts-S.js', 'main-M.js', 'chunk-A.js', 'chunk-B.js', 'chunk-C.js', 'chunk-P.js', 'chunk-F.js', 'chunk-D.js']));
    const once = readFileSync(path.join(dir, 'index.html'), 'utf8');
    const preloaded = [...once.matchAll(/<link rel="modulepreload" href="([\w-]+\.js)">/g)].map((m) => m[1]);
    expect(preloaded.sort()).toEqual(['chunk-A.js', 'chunk-B.js', 'chunk-C.js', 'chunk-D.js', 'chunk-F.js', 'chunk-P.js']);
    // The global scripts (early-reads.js) run from the head, not deferred, after the list they read.
    expect(once).toContain('<script src="scripts-S.js"></script></head>');
    expect(once).not.toContain('defer');
    expect(once.indexOf('lam-kind-code')).toBeLessThan(once.indexOf('<script src="scripts-S.js"'));
    // The app's own script stays last, after every modulepreload link.
    expect(once.lastIndexOf('modulepreload')).toBeLessThan(once.indexOf('<script src="main-M.js"'));
    // The body fetched on first use: its scripts beyond main's, by the stem of its selector.
    expect(result.kinds).toEqual({ 'leading-edge': expect.arrayContaining(['chunk-Q.js', 'chunk-E.js']) });
    expect(result.kinds['leading-edge']).toHaveLength(2);
    const kinds = /<script type="application\/json" id="lam-kind-code">(.*?)<\/script>/.exec(once);
    expect(JSON.parse(kinds![1]!)).toEqual(result.kinds);
    addPreloads(dir);
    expect(readFileSync(path.join(dir, 'index.html'), 'utf8')).toBe(once);
  });
});

describe('addPreloads, fonts', () => {
  it('asks at once for the latin files of the fonts a first screen draws with, before the style sheet, once however often it runs', () => {
    const dir = builtApp();
    mkdirSync(path.join(dir, 'media'));
    for (const file of ['lato-latin-400-normal-AB12CD34.woff2', 'lato-latin-400-normal-EF56GH78.woff', 'lato-latin-ext-400-normal-ZZ11YY22.woff2', 'lato-latin-700-normal-QQ33RR44.woff2', 'jetbrains-mono-latin-400-normal-MM55NN66.woff2', 'jetbrains-mono-greek-400-normal-KK77LL88.woff2', 'symbols-7HRS4YW6.woff2', 'KaTeX_Main-Regular-ARRPAO67.woff2'])
      writeFileSync(path.join(dir, 'media', file), '');
    const index = path.join(dir, 'index.html');
    writeFileSync(index, readFileSync(index, 'utf8').replace('<title>t</title>', '<title>t</title><link rel="stylesheet" href="styles-X.css">'));
    addPreloads(dir);
    const once = readFileSync(index, 'utf8');
    const fonts = [...once.matchAll(/<link rel="preload" href="media\/([^"]+)" as="font" type="font\/woff2" crossorigin>/g)].map((m) => m[1]);
    expect(fonts).toEqual(['lato-latin-400-normal-AB12CD34.woff2', 'lato-latin-700-normal-QQ33RR44.woff2', 'jetbrains-mono-latin-400-normal-MM55NN66.woff2', 'symbols-7HRS4YW6.woff2']);
    expect(once.lastIndexOf('as="font"')).toBeLessThan(once.indexOf('<link rel="stylesheet"'));
    addPreloads(dir);
    expect(readFileSync(index, 'utf8')).toBe(once);
  });
});

/**
 * A built app in the shape Angular's chunk optimizer (rolldown) leaves it: chunks named in base 64 for
 * URLs, selectors in backquotes, and the chunks importing what they share from main.
 */
function optimizedApp(): string {
  const dist = tempDir();
  const files: Record<string, string> = {
    'main-OLDNAME1.js': 'import{p}from"./chunk-Pa_ge-1x.js";var core=1;export{core as c};',
    'main-OLDNAME1.js.map': '{"file":"main-OLDNAME1.js"}',
    'chunk-Pa_ge-1x.js': 'import{c}from"./main-OLDNAME1.js";import{f}from"./chunk--fLow_2.js";var s={selectors:[[`lam-notebook-page`]]};const q=()=>import(`./chunk-qLead-E0.js`);',
    'chunk--fLow_2.js': 'import{c}from"./main-OLDNAME1.js";var s={selectors:[[`lam-flow-cell`]]};export const f=1;',
    'chunk-qLead-E0.js': 'import{c}from"./main-OLDNAME1.js";var s={selectors:[[`lam-leading-edge-cell`]]};',
  };
  for (const [file, text] of Object.entries(files)) writeFileSync(path.join(dist, file), text);
  writeFileSync(path.join(dist, 'index.html'), '<!doctype html><html><head><title>t</title></head><body><lam-root></lam-root><script src="main-OLDNAME1.js" type="module"></script></body></html>');
  return dist;
}

describe('finishWebBuild', () => {
  it('names main after its content, rewrites every script that imports it, and finds the kinds by backquoted selectors', () => {
    const dir = optimizedApp();
    finishWebBuild(dir);
    const mains = readdirSync(dir).filter((f) => /^main-.*\.js$/.test(f));
    expect(mains).toHaveLength(1);
    const main = mains[0]!;
    expect(main).toMatch(/^main-[A-Z2-7]{8}\.js$/);
    expect(main).not.toBe('main-OLDNAME1.js');
    expect(existsSync(path.join(dir, `${main}.map`))).toBe(true);
    for (const file of readdirSync(dir)) expect(readFileSync(path.join(dir, file), 'utf8')).not.toContain('OLDNAME1');
    expect(readFileSync(path.join(dir, 'chunk-qLead-E0.js'), 'utf8')).toContain(`from"./${main}"`);
    const html = readFileSync(path.join(dir, 'index.html'), 'utf8');
    expect(html).toContain(`<script src="${main}" type="module">`);
    expect(html).toContain('<link rel="modulepreload" href="chunk-Pa_ge-1x.js">');
    expect(html).toContain('<link rel="modulepreload" href="chunk--fLow_2.js">');
    const kinds = /<script type="application\/json" id="lam-kind-code">(.*?)<\/script>/.exec(html);
    expect(JSON.parse(kinds![1]!)).toEqual({ 'leading-edge': ['chunk-qLead-E0.js'] });
    // Again: the same name, nothing rewritten.
    const files = Object.fromEntries(readdirSync(dir).map((f) => [f, readFileSync(path.join(dir, f), 'utf8')]));
    expect(nameMainByContent(dir)).toBe(main);
    finishWebBuild(dir);
    expect(Object.fromEntries(readdirSync(dir).map((f) => [f, readFileSync(path.join(dir, f), 'utf8')]))).toEqual(files);
  });

  it('gives two different mains two different names', () => {
    const first = nameMainByContent(optimizedApp());
    const other = optimizedApp();
    writeFileSync(path.join(other, 'main-OLDNAME1.js'), 'var core=2;export{core as c};');
    expect(nameMainByContent(other)).not.toBe(first);
  });
});
