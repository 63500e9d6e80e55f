import type { CellKind } from '@laminote/contracts';

/** What the notebook calls each input field, so a difference reads "Reynolds number 6e6 → 9e6". */
export const FIELD_LABELS: Record<CellKind, Record<string, string>> = {
  flow: {
    mode: 'Flow given by',
    altitude_m: 'Altitude (m)',
    isaTemperatureOffset_K: 'ISA temperature offset (K)',
    mach: 'Mach number',
    referenceLength_m: 'Reference length (m)',
    reynolds: 'Reynolds number',
    turbulenceMode: 'Turbulence given by',
    turbulenceIntensity: 'Turbulence intensity',
    nCrit: 'N_crit',
    sweepDeg: 'Sweep (°)',
  },
  pressure: {
    text: 'Pressure table',
    uploadId: 'Uploaded file',
    filename: 'File name',
    layout: 'Table layout',
    surfaceName: 'Surface name',
    hasRadius: 'Last column is body radius',
  },
  analysis: {
    flowCellId: 'Flow cell',
    pressureCellId: 'Pressure cell',
    criteria: 'Transition criteria',
    trips: 'Forced transition',
    turbulent: 'Turbulent march',
  },
  sweep: {
    analysisCellId: 'Analysis cell',
    parameter: 'Swept parameter',
    from: 'From',
    to: 'To',
    steps: 'Steps',
  },
  flatPlate: {
    mode: 'Given as',
    reynolds: 'Reynolds number',
    length_m: 'Length (m)',
    speed_mps: 'Speed (m/s)',
    kinematicViscosity_m2s: 'Kinematic viscosity (m²/s)',
    transitionMode: 'Transition given by',
    transitionReynolds: 'Transition Reynolds number',
    transitionLocation: 'Transition location (x/L)',
  },
  leadingEdge: {
    flowCellId: 'Flow cell',
    sweepDeg: 'Sweep (°)',
    mode: 'Given as',
    leadingEdgeRadius: 'Leading-edge radius (r/L)',
    velocityGradient: 'Velocity gradient dUe/ds',
    reynolds: 'Reynolds number',
  },
  note: { markdown: 'Text' },
};

/** Input fields that name another cell: shown by that cell's title. */
export const CELL_REFERENCE_FIELDS = new Set(['flowCellId', 'pressureCellId', 'analysisCellId']);

export function fieldLabel(kind: CellKind, path: string): string {
  const [head, ...rest] = path.split('.');
  const label = FIELD_LABELS[kind]?.[head!] ?? head!;
  return rest.length ? `${label}: ${rest.join('.')}` : label;
}
