import { METHODS } from '../src/methods/index';

/**
 * The index of methods in libs/aero/README.md, written from METHODS (the same entries the methods page
 * shows), so the README cannot drift from the code: `readme-index.spec.ts` fails when it is out of date
 * and `npx tsx libs/aero/scripts/readme-index.ts --write` writes it again.
 */

export const INDEX_START = '<!-- methods index: written by libs/aero/scripts/readme-index.ts -->';
export const INDEX_END = '<!-- end of methods index -->';

const cell = (text: string) => text.replace(/\|/g, '\\|').replace(/\s+/g, ' ').trim();

export function methodsIndex(): string {
  const rows = METHODS.map((m) => `| ${cell(m.name)} | \`${m.module}\` | $${cell(m.formulas[0] ?? '')}$ | ${cell(m.validity)} | ${cell(m.sources[0] ?? '')} |`);
  return [INDEX_START, '', '| method | module | formula (first of its set) | valid for | source |', '| --- | --- | --- | --- | --- |', ...rows, '', INDEX_END].join('\n');
}

/** The README with its index replaced by the current one. */
export function withCurrentIndex(readme: string): string {
  const start = readme.indexOf(INDEX_START);
  const end = readme.indexOf(INDEX_END);
  if (start < 0 || end < start) throw new Error('the README has no methods index markers');
  return readme.slice(0, start) + methodsIndex() + readme.slice(end + INDEX_END.length);
}

if (process.argv.includes('--write')) {
  const { readFileSync, writeFileSync } = await import('node:fs');
  const path = new URL('../README.md', import.meta.url);
  writeFileSync(path, withCurrentIndex(readFileSync(path, 'utf8')));
}
