import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { EngineResult, VersionDetail } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { PROJECT_ID, project, provideTestApp, study } from '../../testing/test-app';
import { PLOT_RENDERER } from '../shared/plot';
import { ANALYSIS_CELL, FLOW_CELL, STUDY_ID, V1_ID, V2_ID, summary } from './testing/version-fixtures';
import { VersionCellHarness } from './testing/version-harnesses';
import { VersionPage } from './version-page';

const PRESSURE_CELL = 'c1b2c3d4-0000-4000-8000-000000000002';

/** A flat-plate-like result, invented for the page: one surface, e^N transition at x/c 0.296. */
const result: EngineResult = {
  engineVersion: '1.0.0',
  flow: { reynolds: 8e6, mach: 0, nCrit: 9, nCritFrom: 'given' },
  surfaces: [
    {
      name: 'upper',
      stations: { s: [0, 0.296, 1], x: [0, 0.296, 1], ue: [1, 1, 1], theta: [0, 1e-4, 2e-3], deltaStar: [0, 2.6e-4, 3e-3], H: [2.6, 2.6, 1.4], cf: [null, 0.001, 0.003], n: [0, 9, null] },
      transition: { s: 0.296, by: 'eN', criteria: { eN: { s: 0.296, reTheta: 1030, reS: 2.37e6 } } },
      laminarSeparation: null,
      turbulentSeparation: null,
      cd: 0.00254,
      cdFriction: 0.0023,
    },
  ],
  cd: 0.00254,
  attachmentLine: null,
  warnings: [],
};

function detail(): VersionDetail {
  return {
    ...summary({ id: V2_ID, number: 2, message: 'Re 8 million', parentVersionId: V1_ID }),
    cells: [
      {
        cellId: FLOW_CELL,
        position: 0,
        kind: 'flow',
        title: 'Cruise flow',
        collapsed: false,
        // Altitude, length and turbulence level were typed once and left aside: the flow is given by
        // Re and N_crit, so only those show.
        inputs: { nCrit: 9, mode: 'reynolds', reynolds: 8e6, mach: 0, turbulenceMode: 'nCrit', altitude_m: 11000, isaTemperatureOffset_K: 0, referenceLength_m: 2, turbulenceIntensity: 0.001 },
        revisionId: 'd1b2c3d4-0000-4000-8000-000000000001',
        contentHash: 'f'.repeat(64),
        outputKey: null,
        output: null,
      },
      {
        cellId: PRESSURE_CELL,
        position: 1,
        kind: 'pressure',
        title: 'Flat plate',
        collapsed: false,
        inputs: { text: 'x cp\n0 0\n1 0', layout: 'surface', surfaceName: 'upper', hasRadius: false },
        revisionId: 'd1b2c3d4-0000-4000-8000-000000000002',
        contentHash: 'e'.repeat(64),
        outputKey: null,
        output: null,
      },
      {
        cellId: ANALYSIS_CELL,
        position: 2,
        kind: 'analysis',
        title: 'Transition',
        collapsed: false,
        inputs: { flowCellId: FLOW_CELL, pressureCellId: PRESSURE_CELL, criteria: ['eN'], trips: {}, turbulent: true },
        revisionId: 'd1b2c3d4-0000-4000-8000-000000000003',
        contentHash: 'd'.repeat(64),
        outputKey: 'a'.repeat(64),
        output: { key: 'a'.repeat(64), status: 'ok', result, error: null, engineVersion: '1.0.0', durationMs: 12, computedAt: '2026-03-06T09:00:00.000Z' },
      },
    ],
  };
}

describe('VersionPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [...provideTestApp(), { provide: PLOT_RENDERER, useValue: () => new Promise<never>(() => undefined) }] });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    // The review panel and comment threads on the page are the review part's to test.
    http.match((r) => /\/(review|threads|members)$/.test(r.url) || r.url === `/api/studies/${STUDY_ID}`);
    http.verify();
  });

  it('shows a saved version read-only: its cells worded as the notebook words them, and the stored result', async () => {
    const fixture = TestBed.createComponent(VersionPage);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    fixture.componentRef.setInput('versionId', V2_ID);
    fixture.detectChanges();
    http.expectOne(`/api/versions/${V2_ID}`).flush(detail());
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const page = fixture.nativeElement as HTMLElement;

    expect(page.querySelector('h1')?.textContent).toMatch(/v2\s*Re 8 million/);
    // The breadcrumb names the project and the study.
    for (const r of http.match(`/api/studies/${STUDY_ID}`)) r.flush(study());
    await fixture.whenStable();
    http.expectOne(`/api/projects/${PROJECT_ID}`).flush(project());
    await fixture.whenStable();
    const crumbs = Array.from(page.querySelectorAll('nav.breadcrumb a, nav.breadcrumb span:not([aria-hidden])')).map((e) => e.textContent?.trim());
    expect(crumbs).toEqual(['Projects', 'Larkspur T-62 wing', 'Cruise upper surface, M 0.78', 'main v2']);
    expect(page.textContent).toContain('A saved version, read-only.');
    // Nothing to type into: a version never changes.
    expect(await loader.getAllHarnesses(MatInputHarness)).toHaveLength(0);
    const flow = await loader.getHarness(VersionCellHarness.with({ label: 'Flow condition: Cruise flow' }));
    // In the notebook's order, the choices in words, numbers as the trade writes them.
    expect(await flow.getInputs()).toEqual(['Flow given by: Reynolds number', 'Mach number: 0', 'Reynolds number: 8.000 × 10⁶', 'Turbulence given by: N_crit', 'N_crit: 9']);
    const analysis = await loader.getHarness(VersionCellHarness.with({ label: 'Transition analysis: Transition' }));
    expect(await analysis.getInputs()).toContain('Flow cell: Cruise flow');
    expect(await analysis.getSummaryText()).toContain('0.296 x/c (Envelope eᴺ)');
    expect(await analysis.getSummaryText()).toContain('25.40');
    const compare = await loader.getHarness(MatButtonHarness.with({ text: /What changed/ }));
    expect(await (await compare.host()).getAttribute('href')).toBe(`/studies/${STUDY_ID}/compare?a=${V1_ID}&b=${V2_ID}`);
    // The whole version as one study document, to recompute with the command line or import elsewhere.
    const studyFile = await (await loader.getHarness(MatButtonHarness.with({ text: /Study file/ }))).host();
    expect(await studyFile.getAttribute('href')).toBe(`/api/versions/${V2_ID}/export`);
    expect(await studyFile.getAttribute('download')).not.toBeNull();
  });
});
