import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CELL_KIND_REGISTRY, studyDocumentSchema, type CellKind, type StudyDocument, type VersionSummary } from '@laminote/contracts';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { runAndWait } from '../support/run';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * A study leaves the server as one document and comes back the same without it: the seeded demo study
 * is run on the server (worker threads, job queue), exported, and computed again by the command line
 * (`aero study`); every output must agree to the 7 significant digits outputs are kept to.
 */

let t: TestApp;
const as: Record<string, SignedIn> = {};
let branchId: string;

const root = fileURLToPath(new URL('../..', import.meta.url));

function aeroStudy(document: StudyDocument): StudyDocument {
  const result = spawnSync(join(root, 'node_modules', '.bin', 'tsx'), [join(root, 'libs', 'aero', 'src', 'cli.ts'), 'study', '-'], {
    cwd: root,
    input: JSON.stringify(document),
    encoding: 'utf8',
    maxBuffer: 256 * 1024 * 1024,
    timeout: 120_000,
  });
  expect(result.stderr).toBe('');
  expect(result.status).toBe(0);
  return studyDocumentSchema.parse(JSON.parse(result.stdout));
}

/** Where two outputs differ beyond 7 significant digits (a path and both values), or null. */
function difference(a: unknown, b: unknown, path = ''): string | null {
  if (typeof a === 'number' && typeof b === 'number') {
    return Number(a.toPrecision(7)) === Number(b.toPrecision(7)) ? null : `${path}: ${a} ≠ ${b}`;
  }
  if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) return `${path}: ${a.length} items ≠ ${b.length}`;
    for (let i = 0; i < a.length; i++) {
      const d = difference(a[i], b[i], `${path}[${i}]`);
      if (d) return d;
    }
    return null;
  }
  if (a && b && typeof a === 'object' && typeof b === 'object') {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const key of keys) {
      const d = difference((a as Record<string, unknown>)[key], (b as Record<string, unknown>)[key], `${path}.${key}`);
      if (d) return d;
    }
    return null;
  }
  return Object.is(a, b) ? null : `${path}: ${JSON.stringify(a)} ≠ ${JSON.stringify(b)}`;
}

function expectSameOutputs(stored: StudyDocument, fresh: StudyDocument) {
  expect(fresh.cells.map((c) => c.cellId)).toEqual(stored.cells.map((c) => c.cellId));
  for (const [i, cell] of stored.cells.entries()) {
    const again = fresh.cells[i]!;
    expect(again.inputs, cell.title).toEqual(cell.inputs);
    if (!CELL_KIND_REGISTRY[cell.kind as CellKind].runs) {
      expect(again.output, cell.title).toBeNull();
      continue;
    }
    expect(cell.output, `${cell.title} has a stored output`).not.toBeNull();
    expect(again.output, `${cell.title} was computed again`).not.toBeNull();
    expect({ status: again.output!.status, error: again.output!.error }, cell.title).toEqual({ status: cell.output!.status, error: cell.output!.error });
    expect(difference(cell.output!.result, again.output!.result, cell.title), cell.title).toBeNull();
  }
}

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['lead', 'engineer', 'viewer', 'outsider'] as const) as[role] = await signIn(t.app, role, testEnv.publicUrl);
  const branches = await as['engineer']!.get(`/api/studies/${t.demo.studyId}/branches`).expect(200);
  branchId = branches.body[0].id;
  await runAndWait(as['engineer']!, branchId, {}, 120_000);
}, 180_000);
afterAll(async () => t?.close());

describe('study export and the command line', () => {
  it('exports the demo study draft as a download holding every cell with its stored output', async () => {
    const res = await as['viewer']!.get(`/api/branches/${branchId}/export`).expect(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?outboard-section-.+-main-draft\.laminote\.json"?$/);
    const document = studyDocumentSchema.parse(JSON.parse(res.text));
    expect(document.source).toMatchObject({ kind: 'draft', branchId, versionId: null });
    const kinds = new Set(document.cells.map((c) => c.kind));
    for (const kind of ['flow', 'pressure', 'analysis'] as const) expect(kinds).toContain(kind);
    expect(document.cells.length).toBeGreaterThan(3);
  });

  it('computes every cell of the exported demo study again to the same numbers (7 significant digits)', async () => {
    const stored = studyDocumentSchema.parse(JSON.parse((await as['engineer']!.get(`/api/branches/${branchId}/export`).expect(200)).text));
    // The demo computes: most of its cells hold a good result, not only messages.
    expect(stored.cells.filter((c) => c.output?.status === 'ok').length).toBeGreaterThan(3);
    expectSameOutputs(stored, aeroStudy(stored));
  }, 180_000);

  it('exports a saved version with the outputs it kept, and it too computes again to the same numbers', async () => {
    const head = (await as['lead']!.get(`/api/branches/${branchId}/versions`).expect(200)).body as VersionSummary[];
    const saved = await as['lead']!.post(`/api/branches/${branchId}/versions`, { message: 'Archive for re-checking', expectedHeadVersionId: head[0]?.id ?? null });
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    const version = saved.body as VersionSummary;
    const res = await as['viewer']!.get(`/api/versions/${version.id}/export`).expect(200);
    expect(res.headers['content-disposition']).toMatch(new RegExp(`-main-v${version.number}\\.laminote\\.json"?$`));
    const stored = studyDocumentSchema.parse(JSON.parse(res.text));
    expect(stored.source).toMatchObject({ kind: 'version', versionId: version.id, versionNumber: version.number });
    expectSameOutputs(stored, aeroStudy(stored));
  }, 180_000);

  it('answers 404 to someone outside the project, for the branch and for the version', async () => {
    await as['outsider']!.get(`/api/branches/${branchId}/export`).expect(404);
    const versions = (await as['lead']!.get(`/api/branches/${branchId}/versions`).expect(200)).body as VersionSummary[];
    await as['outsider']!.get(`/api/versions/${versions[0]!.id}/export`).expect(404);
  });
});
