import { newCellInputs, type CellKind, type CellOutput, type Draft, type DraftCell } from '@laminote/contracts';
import { STUDY_ID } from './test-app';

// Invented ids of the demo scenario's notebook (Tamsk Aerodynamics, Larkspur T-62).
export const BRANCH_ID = '4b7d2e91-8c3a-4f5e-9a1b-2c3d4e5f6a70';
export const FLOW_ID = '11111111-2222-4333-8444-555555555501';
export const PRESSURE_ID = '11111111-2222-4333-8444-555555555502';
export const ANALYSIS_ID = '11111111-2222-4333-8444-555555555503';
export const NOTE_ID = '11111111-2222-4333-8444-555555555504';

export function cell(kind: CellKind, cellId: string, overrides: Partial<DraftCell> = {}): DraftCell {
  return {
    cellId,
    kind,
    title: overrides.title ?? kind,
    collapsed: false,
    // What a new cell starts with (the app's `defaultInputs`, which waits for the schemas to load).
    inputs: newCellInputs(kind),
    runState: 'idle',
    problems: [],
    output: null,
    lastGoodOutput: null,
    ...overrides,
  };
}

export function output(result: unknown, overrides: Partial<CellOutput> = {}): CellOutput {
  return {
    key: 'a'.repeat(64),
    status: 'ok',
    result,
    error: null,
    engineVersion: '1.0.0',
    durationMs: 12,
    computedAt: '2026-03-04T11:30:00.000Z',
    ...overrides,
  };
}

export function draft(cells: DraftCell[], overrides: Partial<Draft> = {}): Draft {
  return {
    branchId: BRANCH_ID,
    studyId: STUDY_ID,
    revision: 3,
    cells,
    trash: [],
    basedOnVersionId: null,
    updatedAt: '2026-03-04T11:30:00.000Z',
    updatedBy: { id: '5e0c1a2b-3d4f-4a6b-8c9d-0e1f2a3b4c5d', name: 'Ines Varga' },
    ...overrides,
  };
}
