import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Comparison, Draft, VersionDetail, VersionSummary } from '@laminote/contracts';
import { compareVersions } from '../../server/src/versions/compare';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { runAndWait } from '../support/run';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * The compare page's report (issue 16 follow-up) through the real API on PostgreSQL: the demo study is
 * run and saved (A), its flow cell's altitude lowered by 2000 m, run and saved again (B), and the report of
 * A against B read as HTML and as PDF (opened with Mozilla's PDF reader, pdfjs-dist).
 */

let t: TestApp;
const as: Record<string, SignedIn> = {};
let a: VersionSummary;
let b: VersionSummary;
let comparison: Comparison;

async function save(branchId: string, message: string, expectedHeadVersionId: string | null): Promise<VersionSummary> {
  const res = await as['lead']!.post(`/api/branches/${branchId}/versions`, { message, expectedHeadVersionId });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as VersionSummary;
}

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['lead', 'viewer', 'outsider'] as const) as[role] = await signIn(t.app, role, testEnv.publicUrl);
  const branchId = (await as['lead']!.get(`/api/studies/${t.demo.studyId}/branches`).expect(200)).body[0].id as string;
  await runAndWait(as['lead']!, branchId);
  a = await save(branchId, 'Cruise as seeded', null);
  const draft = (await as['lead']!.get(`/api/branches/${branchId}/draft`).expect(200)).body as Draft;
  const cells = draft.cells.map((c) => {
    const inputs = c.inputs as Record<string, unknown>;
    // The demo's flow cell is set by altitude: 2000 m lower raises the Reynolds number.
    return { cellId: c.cellId, kind: c.kind, title: c.title, collapsed: false, inputs: c.kind === 'flow' && typeof inputs['altitude_m'] === 'number' ? { ...inputs, altitude_m: (inputs['altitude_m'] as number) - 2000 } : inputs };
  });
  expect(cells.some((c) => c.kind === 'flow')).toBe(true);
  const put = await as['lead']!.put(`/api/branches/${branchId}/draft`, { baseRevision: draft.revision, cells });
  expect(put.status, JSON.stringify(put.body)).toBe(200);
  await runAndWait(as['lead']!, branchId);
  b = await save(branchId, 'Cruise 2000 m lower', a.id);
  comparison = (await as['viewer']!.get(`/api/compare?a=${a.id}&b=${b.id}`).expect(200)).body as Comparison;
}, 180_000);
afterAll(async () => t?.close());

const escapeText = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');

describe('the HTML report of a comparison', () => {
  let html = '';
  beforeAll(async () => {
    const res = await as['viewer']!.get(`/api/compare/report.html?a=${a.id}&b=${b.id}`).expect(200);
    expect(res.headers['content-type']).toMatch(/text\/html/);
    // RFC 6266: an ASCII name and the UTF-8 one.
    expect(res.headers['content-disposition']).toMatch(/^inline; filename="[^"]+\.html"; filename\*=UTF-8''.+\.html$/);
    html = res.text;
  });

  it('names both versions, the changed input with both values, and the caution', () => {
    expect(html).toContain(`v${a.number} on branch`);
    expect(html).toContain('Cruise as seeded');
    expect(html).toContain('Cruise 2000 m lower');
    const flowDiff = comparison.cells.find((c) => c.kind === 'flow' && c.change === 'changed')!;
    const altitude = flowDiff.fields.find((f) => f.path === 'altitude_m')!;
    expect(html).toContain(escapeText(`${altitude.label}: ${altitude.oldText} → ${altitude.newText}`));
    expect(html).toContain(escapeText(comparison.caution));
  });

  it('gives each analysis its A/B table and overlay plots as inline SVG, and nothing fetched', () => {
    expect(comparison.results.length).toBeGreaterThan(0);
    for (const r of comparison.results) expect(html).toContain(`data-cell-id="${r.cellId}"`);
    const plots = html.match(/<figure class="plot"><svg[^>]*>/g) ?? [];
    expect(plots.length).toBeGreaterThanOrEqual(comparison.results[0]!.surfaces.length * 2);
    expect(html).toContain('B − A');
    // Criteria in the words of the screen, not their keys.
    expect(html).toContain('upper: Envelope eᴺ');
    expect(html).not.toMatch(/: (eN|hRx|crossflowC1)</);
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/(src|href)="(https?:)?\/\//i);
  });

  it('is 404 for an outsider and 400 naming the field for a malformed id', async () => {
    await as['outsider']!.get(`/api/compare/report.pdf?a=${a.id}&b=${b.id}`).expect(404);
    const outsider = await as['outsider']!.get(`/api/compare/report.html?a=${a.id}&b=${b.id}`);
    expect(outsider.status).toBe(404);
    const bad = await as['viewer']!.get(`/api/compare/report.html?a=${a.id}&b=nope`).expect(400);
    expect(JSON.stringify(bad.body)).toContain('b must name a version');
  });
});

describe('the PDF report of a comparison', () => {
  it('opens, and holds the same content as the HTML report: both versions, the changed input, every analysis and the caution', async () => {
    const res = await as['viewer']!.get(`/api/compare/report.pdf?a=${a.id}&b=${b.id}&download=1`).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="[^"]+\.pdf"/);
    const pdf = await getDocument({ data: new Uint8Array(res.body as Buffer), useSystemFonts: false, isEvalSupported: false }).promise;
    let text = '';
    for (let p = 1; p <= pdf.numPages; p++) {
      const page = await pdf.getPage(p);
      text += (await page.getTextContent()).items.map((i) => ('str' in i ? i.str : '')).join(' ') + '\n';
    }
    const flat = text.replace(/\s+/g, ' ');
    expect(flat).toContain('Cruise as seeded');
    expect(flat).toContain('Cruise 2000 m lower');
    const altitude = comparison.cells.find((c) => c.kind === 'flow' && c.change === 'changed')!.fields.find((f) => f.path === 'altitude_m')!;
    expect(flat).toContain(`${altitude.label}: ${altitude.oldText} → ${altitude.newText}`.replace(/\s+/g, ' '));
    for (const r of comparison.results) expect(flat).toContain(r.title.replace(/\s+/g, ' '));
    expect(flat).toContain('upper: Envelope eᴺ');
    expect(flat).toContain('B − A');
    expect(flat).toContain(comparison.caution.replace(/\s+/g, ' ').slice(0, 60));
    expect(flat).toContain(`page ${pdf.numPages} of ${pdf.numPages}`);
    await pdf.destroy();
  });
});

describe('the comparison as GET /api/compare answers it (its analyses written once per pair of outputs, then reused)', () => {
  const ask = async () => (await as['viewer']!.get(`/api/compare?a=${a.id}&b=${b.id}`).expect(200)).body as Comparison;
  const fresh = async () => JSON.parse(JSON.stringify(await compareVersions(t.database.db, a.id, b.id))) as Comparison;

  it('is the comparison worked out afresh, on the first ask and on a later one', async () => {
    expect(comparison.results.length).toBeGreaterThan(0);
    expect(comparison.results.every((r) => r.statusA === 'ok' && r.statusB === 'ok')).toBe(true);
    expect(comparison).toEqual(await fresh());
    expect(await ask()).toEqual(await fresh());
  });

  it('reads a side as not run once its output is gone, not as the text kept from before', async () => {
    const { cells } = (await as['viewer']!.get(`/api/versions/${b.id}`).expect(200)).body as VersionDetail;
    const analysis = cells.find((c) => c.cellId === comparison.results[0]!.cellId)!;
    expect(analysis.outputKey).toBeTruthy();
    await t.database.pool.query('delete from outputs where key = $1', [analysis.outputKey]);
    const after = await ask();
    expect(after.results[0]).toMatchObject({ cellId: analysis.cellId, statusA: 'ok', statusB: 'notRun' });
    expect(after).toEqual(await fresh());
  });
});
