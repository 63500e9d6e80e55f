import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { ENGINE_CAUTION, ENGINE_VERSION } from '@laminote/aero';
import type { VersionDetail, VersionSummary } from '@laminote/contracts';
import { createTestApp, type TestApp } from '../support/app';
import { testEnv } from '../support/env';
import { signIn, type SignedIn } from '../support/sign-in';

/**
 * Version reports (issue 16) through the real API on PostgreSQL: the demo study is run and saved, a
 * reviewer approves it, and its report is read as HTML and as PDF (opened with Mozilla's PDF reader).
 */

let t: TestApp;
const as: Record<string, SignedIn> = {};
let version: VersionDetail;

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['lead', 'reviewer', 'viewer', 'outsider'] as const) as[role] = await signIn(t.app, role, testEnv.publicUrl);
  const branches = await as['lead']!.get(`/api/studies/${t.demo.studyId}/branches`).expect(200);
  const branchId = branches.body[0].id as string;
  // A run answers at once (200, all cached) or as a job (202) followed to its end.
  const run = await as['lead']!.post(`/api/branches/${branchId}/run`, {});
  expect([200, 202], JSON.stringify(run.body)).toContain(run.status);
  for (let state = run.body?.job?.state as string | undefined; run.status === 202 && (state === 'queued' || state === 'running'); ) {
    await new Promise((resolve) => setTimeout(resolve, 100));
    state = (await as['lead']!.get(`/api/jobs/${run.body.jobId}`).expect(200)).body.state;
    expect(state).not.toMatch(/failed|cancelled/);
  }
  const saved = await as['lead']!.post(`/api/branches/${branchId}/versions`, { message: 'Cruise as seeded, for the report', expectedHeadVersionId: null });
  expect(saved.status, JSON.stringify(saved.body)).toBe(201);
  const summary = saved.body as VersionSummary;
  await as['reviewer']!.post(`/api/versions/${summary.id}/verdicts`, { verdict: 'approved', summary: 'Laminar run and drag checked against the tunnel estimate' }).expect(201);
  version = (await as['viewer']!.get(`/api/versions/${summary.id}`).expect(200)).body as VersionDetail;
}, 120_000);
afterAll(async () => t?.close());

describe('the HTML report of a version', () => {
  let html = '';
  beforeAll(async () => {
    const res = await as['viewer']!.get(`/api/versions/${version.id}/report.html`).expect(200);
    expect(res.headers['content-type']).toMatch(/text\/html/);
    html = res.text;
  });

  it('holds every cell of the version with its provenance', () => {
    expect(version.cells.length).toBeGreaterThanOrEqual(6);
    for (const cell of version.cells) {
      expect(html).toContain(`data-cell-id="${cell.cellId}"`);
      if (cell.output) expect(html).toContain(`output key ${cell.output.key}`);
    }
    expect(html).toContain(`Laminote engine ${ENGINE_VERSION}`);
  });

  it('draws the pressure, the analysis and the sweep as inline vector plots with lines', () => {
    const plots = html.match(/<figure class="plot"><svg[^>]*>/g) ?? [];
    const kinds = version.cells.map((c) => c.kind);
    const expected = (kinds.includes('pressure') ? 1 : 0) + (kinds.includes('analysis') ? 3 : 0) + (kinds.includes('sweep') ? 2 : 0);
    expect(plots.length).toBe(expected);
    expect((html.match(/<path d="M[^"]+"/g) ?? []).length).toBeGreaterThanOrEqual(expected);
  });

  it('says the review state, the verdict, the caution and the analysis results', () => {
    expect(html).toMatch(/data-review-state>Approved/);
    expect(html).toContain('Laminar run and drag checked against the tunnel estimate');
    expect(html).toContain(ENGINE_CAUTION);
    expect(html).toContain('Transition, separation and drag per surface');
  });

  it('is self-contained: no script, nothing fetched from elsewhere', () => {
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/(src|href)="(https?:)?\/\//i);
    expect(html).not.toMatch(/url\((?!data:)/i);
  });
});

describe('the PDF report of a version', () => {
  it('opens, has its pages and holds every cell, the verdict and the caution', async () => {
    const res = await as['viewer']!.get(`/api/versions/${version.id}/report.pdf`).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const bytes = new Uint8Array(res.body as Buffer);
    const pdf = await getDocument({ data: bytes, useSystemFonts: false, isEvalSupported: false }).promise;
    expect(pdf.numPages).toBeGreaterThanOrEqual(3);
    let text = '';
    for (let p = 1; p <= pdf.numPages; p++) {
      const page = await pdf.getPage(p);
      text += (await page.getTextContent()).items.map((i) => ('str' in i ? i.str : '')).join(' ') + '\n';
    }
    const flat = text.replace(/\s+/g, ' ');
    for (const cell of version.cells) expect(flat).toContain(cell.title.replace(/\s+/g, ' '));
    expect(flat).toContain('Approved');
    expect(flat).toContain(`page ${pdf.numPages} of ${pdf.numPages}`);
    expect(flat).toContain('Engineering estimates from integral boundary-layer methods');
    // θ and Re_θ print (the embedded face carries Greek).
    expect(flat).toContain('Re_θ');
    await pdf.destroy();
  });
});

describe('who may have a report', () => {
  it('answers 404 to someone outside the project, for an unknown version, and a 4xx for a malformed one', async () => {
    await as['outsider']!.get(`/api/versions/${version.id}/report.html`).expect(404);
    await as['outsider']!.get(`/api/versions/${version.id}/report.pdf`).expect(404);
    await as['viewer']!.get('/api/versions/00000000-0000-4000-8000-000000000000/report.pdf').expect(404);
    const malformed = await as['viewer']!.get('/api/versions/not-a-version/report.html');
    expect(malformed.status).toBeGreaterThanOrEqual(400);
    expect(malformed.status).toBeLessThan(500);
  });

  it('offers the file for download with a readable name when asked', async () => {
    const res = await as['viewer']!.get(`/api/versions/${version.id}/report.html?download=1`).expect(200);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="[^"]+v1[^"]*\.html"/);
  });
});
