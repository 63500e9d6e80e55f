/**
 * `npm run icons`: makes the web app's icon font, a subset of the Material Symbols (outlined) variable
 * font with only the icons the app names, instead of shipping all ~4,000 of them (4 MB).
 *
 * The icons are found by reading the app's sources: every quoted word or element text that is an icon
 * name (`<mat-icon>history</mat-icon>`, `icon: 'air'`). Harfbuzz (subset-font) keeps the ligatures that
 * turn those words into glyphs, without its layout closure, which would otherwise keep every icon whose
 * letters the subset keeps; the glyphs are kept through their private-use code points. Weight, grade and
 * optical size are pinned to the values the app draws with; FILL stays variable.
 *
 * `npm run icons -- --check` says whether the committed font is current (the unit test does the same).
 */
import { createHash } from 'node:crypto';
import { readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { ROOT } from './lib/paths';

const require = createRequire(import.meta.url);

export const ICON_FONT = path.join(ROOT, 'apps/web/src/icons/symbols.woff2');
export const ICON_MANIFEST = path.join(ROOT, 'apps/web/src/icons/symbols.json');
const SOURCE_FONT = path.join(ROOT, 'node_modules/material-symbols/material-symbols-outlined.woff2');
const SCANNED = ['apps/web/src', 'libs/contracts/src'];
/** Letters a ligature may be spelt with. */
const LIGATURE_LETTERS = 'abcdefghijklmnopqrstuvwxyz0123456789_';
const PINNED_AXES = { wght: 400, GRAD: 0, opsz: 24, FILL: { min: 0, max: 1, default: 0 } };

export interface IconManifest {
  source: string;
  names: string[];
  sha256: string;
}

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(full);
    return /\.(ts|html)$/.test(entry.name) && !/\.spec\.ts$/.test(entry.name) ? [full] : [];
  });
}

/**
 * Icon names the app's sources mention, sorted: the words that the full font draws as one glyph (its
 * ligatures include names its package's name list lacks, such as older aliases).
 */
export async function usedIconNames(): Promise<string[]> {
  const shape = shaper(await harfbuzz(), await toTrueType(readFileSync(SOURCE_FONT)));
  const words = new Set<string>();
  for (const file of SCANNED.flatMap((dir) => sourceFiles(path.join(ROOT, dir)))) {
    for (const m of readFileSync(file, 'utf8').matchAll(/[>'"`]\s*([a-z0-9_]{2,})\s*[<'"`]/g)) words.add(m[1]!);
  }
  return [...words].filter((word) => shape(word).length === 1).sort();
}

async function harfbuzz(): Promise<Harfbuzz> {
  return (await import('harfbuzzjs')) as Harfbuzz;
}

export function sha256(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

export function readManifest(): IconManifest {
  return JSON.parse(readFileSync(ICON_MANIFEST, 'utf8')) as IconManifest;
}

type Harfbuzz = typeof import('harfbuzzjs');

/** The glyphs a word shapes to in a font (one glyph when the font has the word's ligature). */
export function shaper(hb: Harfbuzz, ttf: Uint8Array): (text: string) => number[] {
  const font = new hb.Font(new hb.Face(new hb.Blob(ttf)));
  return (text) => {
    const buffer = new hb.Buffer();
    buffer.addText(text);
    buffer.guessSegmentProperties();
    hb.shape(font, buffer);
    return buffer.getGlyphInfos().map((info) => info.codepoint);
  };
}

export async function toTrueType(font: Uint8Array): Promise<Uint8Array> {
  const fontverter = require('fontverter') as { convert(font: Uint8Array, format: string): Promise<Uint8Array> };
  return fontverter.convert(font, 'truetype');
}

async function buildFont(names: string[]): Promise<Uint8Array> {
  const hb = await harfbuzz();
  const subsetFont = require('subset-font') as (font: Uint8Array, text: string, options: object) => Promise<Uint8Array>;
  const original = readFileSync(SOURCE_FONT);
  const ttf = await toTrueType(original);
  const shape = shaper(hb, ttf);
  const codePointOfGlyph = new Map<number, number>();
  for (const codePoint of [...new hb.Face(new hb.Blob(ttf)).collectUnicodes()]) {
    if (codePoint < 0xe000) continue;
    const glyphs = shape(String.fromCodePoint(codePoint));
    if (glyphs.length === 1) codePointOfGlyph.set(glyphs[0]!, codePoint);
  }
  let text = LIGATURE_LETTERS;
  for (const name of names) {
    const glyphs = shape(name);
    const codePoint = glyphs.length === 1 ? codePointOfGlyph.get(glyphs[0]!) : undefined;
    if (codePoint === undefined) throw new Error(`icon "${name}" has no glyph of its own in Material Symbols`);
    text += String.fromCodePoint(codePoint);
  }
  return subsetFont(original, text, { targetFormat: 'woff2', noLayoutClosure: true, variationAxes: PINNED_AXES });
}

async function main(): Promise<void> {
  const names = await usedIconNames();
  const version = (JSON.parse(readFileSync(path.join(ROOT, 'node_modules/material-symbols/package.json'), 'utf8')) as { version: string }).version;
  if (process.argv.includes('--check')) {
    const manifest = readManifest();
    const current = manifest.names.join(' ') === names.join(' ') && sha256(readFileSync(ICON_FONT)) === manifest.sha256;
    process.stdout.write(current ? 'icon font is current\n' : 'icon font is out of date: run npm run icons\n');
    process.exit(current ? 0 : 1);
  }
  const font = await buildFont(names);
  writeFileSync(ICON_FONT, font);
  const manifest: IconManifest = { source: `material-symbols ${version}, outlined`, names, sha256: sha256(font) };
  writeFileSync(ICON_MANIFEST, JSON.stringify(manifest, null, 2) + '\n');
  process.stdout.write(`${names.length} icons, ${font.byteLength} bytes → ${path.relative(ROOT, ICON_FONT)}\n`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname)) void main();
