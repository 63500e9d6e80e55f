import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import {
  CELL_KIND_REGISTRY,
  CELL_KINDS,
  CELL_SCHEMAS,
  newCellInputs,
  referenceFields,
  RUN_RANK,
  upstreamCellIds,
  type CellKind,
} from '@laminote/contracts';
import type { z } from 'zod';
import { describe, expect, it } from 'vitest';
import { CELL_COMPUTE } from './compute';

/**
 * A cell kind has one home: a registry entry (libs/contracts), a compute module (here), a component
 * folder in the web app. A kind missing from any of them fails here rather than silently.
 */

const kebab = (kind: string) => kind.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`);
const webFolder = (kind: string) => fileURLToPath(new URL(`../../../../apps/web/src/app/notebook/${kebab(kind)}/${kebab(kind)}-cell.ts`, import.meta.url));
const computeModule = (kind: string) => fileURLToPath(new URL(`./${kebab(kind)}.ts`, import.meta.url));

describe('the cell-kind registry', () => {
  it.each(CELL_KINDS)('%s has its schemas, its computation, its web component and a place in the run', (kind) => {
    const spec = CELL_KIND_REGISTRY[kind];
    expect(spec.label).not.toBe('');
    expect(spec.icon).toMatch(/^[a-z_]+$/);
    expect(CELL_SCHEMAS[kind].inputs).toBeDefined();
    expect(CELL_SCHEMAS[kind].result !== null).toBe(spec.runs);
    expect(Object.hasOwn(CELL_COMPUTE, kind)).toBe(spec.runs);
    if (spec.runs) expect(existsSync(computeModule(kind)), `libs/aero/src/cells/${kebab(kind)}.ts`).toBe(true);
    expect(existsSync(webFolder(kind)), `apps/web/src/app/notebook/${kebab(kind)}/${kebab(kind)}-cell.ts`).toBe(true);
    expect(Number.isInteger(RUN_RANK[kind])).toBe(true);
  });

  it.each(CELL_KINDS)('%s: every input field has a label on screen and a new cell is valid once its references are filled', (kind) => {
    const shape = (CELL_SCHEMAS[kind].inputs as unknown as z.ZodObject).shape;
    expect(Object.keys(CELL_KIND_REGISTRY[kind].fields).sort()).toEqual(Object.keys(shape).sort());
    const fresh = newCellInputs(kind);
    for (const [field] of referenceFields(kind)) fresh[field] = '00000000-0000-4000-8000-000000000000';
    expect(CELL_SCHEMAS[kind].inputs.safeParse(fresh).error?.issues ?? []).toEqual([]);
  });

  it('runs every kind after the kinds it may name', () => {
    for (const kind of CELL_KINDS) {
      for (const [field, ref] of referenceFields(kind)) {
        expect(Object.keys(CELL_KIND_REGISTRY[kind].fields)).toContain(field);
        for (const named of ref.kinds) expect(RUN_RANK[named], `${kind}.${field} → ${named}`).toBeLessThan(RUN_RANK[kind]);
      }
    }
    expect(RUN_RANK.flow).toBe(0);
    expect(RUN_RANK.sweep).toBeGreaterThan(RUN_RANK.analysis);
  });

  it('reads the cells a cell names from its reference fields', () => {
    const kinds = Object.fromEntries(CELL_KINDS.map((k) => [k, k])) as Record<CellKind, CellKind>;
    expect(upstreamCellIds(kinds.analysis, { flowCellId: 'a', pressureCellId: 'b', criteria: [] })).toEqual(['a', 'b']);
    expect(upstreamCellIds(kinds.leadingEdge, { flowCellId: null })).toEqual([]);
    expect(upstreamCellIds(kinds.sweep, { analysisCellId: 'c' })).toEqual(['c']);
  });
});

describe('the zod-free half of the registry', () => {
  it('imports nothing, so a screen that needs only labels does not load the schemas', async () => {
    const { readFileSync } = await import('node:fs');
    const text = readFileSync(fileURLToPath(new URL('../../../contracts/src/cell-kinds.ts', import.meta.url)), 'utf8');
    expect(text).not.toMatch(/^\s*import\s/m);
    expect(text).not.toMatch(/\bfrom\s+['"]/);
  });
});
