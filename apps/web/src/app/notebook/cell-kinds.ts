import { CELL_KIND_LABELS, type CellKind, type RunState } from '@laminote/contracts';

/** How each kind of cell shows itself in the stack, and what a new one starts with. */
export interface CellKindInfo {
  readonly kind: CellKind;
  readonly label: string;
  /** A Material Symbols name. */
  readonly icon: string;
  /** One line in the add-cell menu. */
  readonly hint: string;
  /** Whether the kind computes something (and so has a run state and a Run button). */
  readonly runs: boolean;
}

const INFO: Record<CellKind, Omit<CellKindInfo, 'kind' | 'label'>> = {
  flow: { icon: 'air', hint: 'Altitude, Mach and length, or Reynolds; N_crit; sweep', runs: true },
  pressure: { icon: 'ssid_chart', hint: 'Paste or upload a Cp table', runs: true },
  analysis: { icon: 'insights', hint: 'Boundary layer and transition along each surface', runs: true },
  flatPlate: { icon: 'straighten', hint: 'Laminar, turbulent and mixed skin friction', runs: true },
  leadingEdge: { icon: 'change_history', hint: 'Attachment-line Reynolds number and verdict', runs: true },
  sweep: { icon: 'tune', hint: 'Re-run an analysis over a range of one parameter', runs: true },
  note: { icon: 'notes', hint: 'Markdown text', runs: false },
};

/** The kinds offered when adding a cell, in the order a study is usually built. */
export const ADDABLE_KINDS: readonly CellKind[] = ['flow', 'pressure', 'analysis', 'flatPlate', 'leadingEdge', 'sweep', 'note'];

export function cellKindInfo(kind: CellKind): CellKindInfo {
  return { kind, label: CELL_KIND_LABELS[kind], ...INFO[kind] };
}

/** Inputs of a new cell: every field filled, so nothing falls back to a default the user never saw. */
export function defaultInputs(kind: CellKind): Record<string, unknown> {
  switch (kind) {
    case 'flow':
      return {
        mode: 'altitude',
        altitude_m: 11000,
        isaTemperatureOffset_K: 0,
        mach: 0.7,
        referenceLength_m: 2,
        turbulenceMode: 'nCrit',
        nCrit: 9,
        sweepDeg: 0,
      };
    case 'pressure':
      return { text: '', uploadId: null, filename: null, layout: 'closedLoop', surfaceName: 'upper', hasRadius: false };
    case 'analysis':
      return { flowCellId: '', pressureCellId: '', criteria: ['eN', 'michel', 'hRx', 'granville'], trips: {}, turbulent: true };
    case 'flatPlate':
      return {
        mode: 'reynolds',
        reynolds: 1e7,
        length_m: 2,
        speed_mps: 200,
        kinematicViscosity_m2s: 3.9e-5,
        transitionMode: 'reynolds',
        transitionReynolds: 3e6,
        transitionLocation: 0.3,
      };
    case 'leadingEdge':
      return { flowCellId: null, sweepDeg: 25, mode: 'radius', leadingEdgeRadius: 0.01 };
    case 'sweep':
      return { analysisCellId: '', parameter: 'nCrit', from: 7, to: 12, steps: 6 };
    case 'note':
      return { markdown: '' };
  }
}

/** Laminote's words for a cell's run state, with the symbol shown beside them. */
export const RUN_STATE_INFO: Record<RunState | 'running', { readonly label: string; readonly icon: string; readonly description: string }> = {
  idle: { label: 'Not run yet', icon: 'radio_button_unchecked', description: 'This cell has not been computed.' },
  current: { label: 'Up to date', icon: 'check_circle', description: 'The result matches the inputs and everything above.' },
  outdated: {
    label: 'Needs a rerun',
    icon: 'update',
    description: 'The inputs, or a cell this one uses, changed since the result shown was computed.',
  },
  failed: { label: 'Run failed', icon: 'error', description: 'The last run failed; the last good result stays below.' },
  running: { label: 'Computing…', icon: 'progress_activity', description: 'The server is computing this cell.' },
};
