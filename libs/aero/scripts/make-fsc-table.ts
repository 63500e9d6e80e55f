/**
 * Writes libs/aero/src/falkner-skan-cooke-table.ts: the Falkner–Skan–Cooke similarity profiles solved
 * by shooting with odex (falkner-skan-cooke.ts), one row per β of FSC_TABLE_BETAS.
 *
 *   npx tsx libs/aero/scripts/make-fsc-table.ts
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { computeFalknerSkanCookeTable } from '../src/falkner-skan-cooke';

const rows = computeFalknerSkanCookeTable();
const keys = Object.keys(rows[0]) as (keyof (typeof rows)[number])[];
const body = rows.map((row) => `  { ${keys.map((k) => `${k}: ${Number(row[k].toPrecision(10))}`).join(', ')} },`).join('\n');
const text = `import type { FalknerSkanCookeProfile } from './falkner-skan-cooke';

/**
 * Falkner–Skan–Cooke similarity profiles by β, written by libs/aero/scripts/make-fsc-table.ts (shooting
 * with odex, falkner-skan-cooke.ts). Do not edit by hand; falkner-skan-cooke.spec.ts solves every row
 * again and compares.
 */
export const FSC_TABLE: readonly FalknerSkanCookeProfile[] = [
${body}
];
`;
writeFileSync(fileURLToPath(new URL('../src/falkner-skan-cooke-table.ts', import.meta.url)), text);
console.log(`wrote ${rows.length} rows`);
