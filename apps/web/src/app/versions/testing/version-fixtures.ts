import type { AnalysisComparison, Branch, CellDiff, Comparison, StudyHistory, SurfaceComparison, VersionSummary } from '@laminote/contracts';
import { PROJECT_ID, STUDY_ID } from '../../../testing/test-app';

// Invented versions of the invented Larkspur T-62 study (fictional Tamsk Aerodynamics).
export const MAIN_ID = 'a1b2c3d4-0000-4000-8000-000000000001';
export const VARIANT_ID = 'a1b2c3d4-0000-4000-8000-000000000002';
export const V1_ID = 'b1b2c3d4-0000-4000-8000-000000000001';
export const V2_ID = 'b1b2c3d4-0000-4000-8000-000000000002';
export const V3_ID = 'b1b2c3d4-0000-4000-8000-000000000003';
export const FLOW_CELL = 'c1b2c3d4-0000-4000-8000-000000000001';
export const ANALYSIS_CELL = 'c1b2c3d4-0000-4000-8000-000000000003';

const OSKAR = { id: '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d', name: 'Oskar Lind' };

export function summary(overrides: Partial<VersionSummary> = {}): VersionSummary {
  return {
    id: V1_ID,
    studyId: STUDY_ID,
    branchId: MAIN_ID,
    branchName: 'main',
    number: 1,
    message: 'Cruise baseline',
    author: OSKAR,
    createdAt: '2026-03-05T09:00:00.000Z',
    parentVersionId: null,
    cellCount: 3,
    isBaseline: false,
    review: null,
    ...overrides,
  };
}

export function branch(overrides: Partial<Branch> = {}): Branch {
  return {
    id: MAIN_ID,
    studyId: STUDY_ID,
    name: 'main',
    purpose: 'Main line of the study',
    forkedFromVersionId: null,
    headVersionId: V2_ID,
    headNumber: 2,
    archived: false,
    createdBy: OSKAR,
    createdAt: '2026-03-03T10:00:00.000Z',
    ...overrides,
  };
}

export function history(overrides: Partial<StudyHistory> = {}): StudyHistory {
  const v1 = summary();
  const v2 = summary({ id: V2_ID, number: 2, message: 'Re 8 million', parentVersionId: V1_ID, createdAt: '2026-03-06T09:00:00.000Z' });
  return {
    studyId: STUDY_ID,
    baselineVersionId: null,
    permissions: { saveVersion: true, branch: true, markBaseline: true, editStudy: true },
    branches: [{ ...branch(), headNumber: 2, versionCount: 2, draftRevision: 4, draftBasedOnVersionId: V2_ID, forkedFrom: null }],
    versions: [v2, v1],
    ...overrides,
  };
}

export function flowChange(): CellDiff {
  return {
    cellId: FLOW_CELL,
    kind: 'flow',
    change: 'changed',
    moved: false,
    titleA: 'Cruise flow',
    titleB: 'Cruise flow',
    positionA: 0,
    positionB: 0,
    fields: [{ path: 'reynolds', label: 'Reynolds number', old: 4e6, new: 8e6, oldText: '4e6', newText: '8e6', relative: 1 }],
    table: null,
    text: null,
    outputChanged: true,
  };
}

const d = (a: number | null, b: number | null, effect: 'favourable' | 'adverse' | 'neutral') => ({ a, b, delta: a !== null && b !== null ? b - a : null, effect });

function surface(): SurfaceComparison {
  const series = (scale: number) => ({ x: [0, 0.25, 0.5], cp: [0, 0, 0], n: [0, 4 * scale, 9], H: [2.61, 2.61, 2.61] });
  return {
    name: 'upper',
    transition: { ...d(0.58, 0.296, 'adverse'), coordinate: 'x', shift: 'forward', byA: 'eN', byB: 'eN' },
    criteria: [{ criterion: 'eN', ...d(0.58, 0.296, 'adverse'), coordinate: 'x', shift: 'forward', byA: null, byB: null }],
    laminarExtent: d(0.58, 0.296, 'adverse'),
    cd: d(0.00238, 0.00254, 'adverse'),
    cdFriction: d(0.0021, 0.0023, 'adverse'),
    laminarSeparation: d(null, null, 'neutral'),
    turbulentSeparation: d(null, null, 'neutral'),
    overlay: { coordinate: 'x', a: series(1), b: series(2) },
  };
}

export function analysisResult(): AnalysisComparison {
  return {
    cellId: ANALYSIS_CELL,
    title: 'Free transition',
    statusA: 'ok',
    statusB: 'ok',
    errorA: null,
    errorB: null,
    flow: { reynolds: d(4e6, 8e6, 'neutral'), mach: d(0, 0, 'neutral'), nCrit: d(9, 9, 'neutral') },
    cd: d(0.00238, 0.00254, 'adverse'),
    surfaces: [surface()],
    warningsA: [],
    warningsB: [],
  };
}

export function comparison(): Comparison {
  const a = summary();
  const b = summary({ id: V2_ID, number: 2, message: 'Re 8 million', parentVersionId: V1_ID });
  return {
    studyId: STUDY_ID,
    a,
    b,
    summary: { added: 0, removed: 0, changed: 1, moved: 0, unchanged: 2 },
    cells: [flowChange()],
    results: [analysisResult()],
    sweeps: [],
    caution: 'Differences between engineering estimates from integral boundary-layer methods and empirical transition criteria.',
  };
}

export { PROJECT_ID, STUDY_ID };
