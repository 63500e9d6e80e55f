/**
 * The cell-kind registry: what each kind of notebook cell is, in plain data. Zod-free on purpose, so
 * a screen that only needs a label, an icon or the fields a cell names imports this module alone
 * (`@laminote/contracts/cell-kinds`) and not the schemas. The input and result schemas of each kind
 * are in `cell-schemas.ts`; each kind's computation is in `libs/aero/src/cells/`. See README.md,
 * "How to add a cell kind".
 */

export const CELL_KINDS = ['flow', 'pressure', 'section', 'body', 'analysis', 'polar', 'sweep', 'comparison', 'flatPlate', 'leadingEdge', 'note'] as const;
export type CellKind = (typeof CELL_KINDS)[number];

/**
 * The transition criteria an analysis may evaluate, in the order the notebook lists them. The two
 * crossflow criteria apply to swept wings (Owen–Randall crossflow Reynolds number, Arnal's C1).
 */
export const TRANSITION_CRITERIA = ['eN', 'crossflow', 'crossflowC1', 'michel', 'hRx', 'granville'] as const;
export type TransitionCriterion = (typeof TRANSITION_CRITERIA)[number];

/** What set the governing transition location. */
export const TRANSITION_CAUSES = [...TRANSITION_CRITERIA, 'trip', 'laminarSeparation'] as const;
export type TransitionCause = (typeof TRANSITION_CAUSES)[number];

/** Each criterion's name as a table cell or a legend shows it (capitalised; sentences use VALUE_LABELS). */
export const CRITERION_LABELS: Readonly<Record<TransitionCriterion, string>> = {
  eN: 'Envelope eᴺ',
  crossflow: 'Crossflow R_cf',
  crossflowC1: 'Crossflow C1',
  michel: 'Michel',
  hRx: 'H–Re_x',
  granville: 'Granville',
};

/** What set a transition location, as a table cell shows it. */
export const TRANSITION_CAUSE_LABELS: Readonly<Record<TransitionCause, string>> = {
  ...CRITERION_LABELS,
  trip: 'Trip',
  laminarSeparation: 'Laminar separation',
};

/** A criterion's or cause's label; an id from a newer engine than this code shows as itself. */
export const transitionCauseLabel = (id: string): string => (TRANSITION_CAUSE_LABELS as Record<string, string>)[id] ?? id;

/** An input field that names another cell (its id), and the kinds it may name. */
export interface CellReference {
  readonly kinds: readonly CellKind[];
  /** Whether the cell cannot run without it. */
  readonly required: boolean;
}

export interface CellKindSpec {
  /** What the notebook calls the kind. */
  readonly label: string;
  /** A Material Symbols name. */
  readonly icon: string;
  /** One line in the add-cell menu. */
  readonly hint: string;
  /** Whether the kind computes something (has a run state, a Run button and a result schema). */
  readonly runs: boolean;
  /**
   * Whether one cell of the kind computes in one engine call of milliseconds to a few tens of
   * milliseconds (no cases, no points): a run left with a few such cells is computed by the app server
   * at once rather than queued, since waiting for a worker would cost more than the work. Sweeps and
   * polars, and anything of that size, are not quick. False for a kind that does not run.
   */
  readonly quick: boolean;
  /** The input fields that name other cells. The run order follows from these. */
  readonly references: Readonly<Record<string, CellReference>>;
  /** Every input field by its label on screen, in the order the cell shows them. */
  readonly fields: Readonly<Record<string, string>>;
  /**
   * What a new cell starts with where the input schema has no default (the schema fills the rest),
   * so nothing falls back to a value the user never saw.
   */
  readonly starter: Readonly<Record<string, unknown>>;
}

/** The registry. Its order is the order of the add-cell menu, as a study is usually built. */
export const CELL_KIND_REGISTRY: { readonly [K in CellKind]: CellKindSpec } = {
  flow: {
    label: 'Flow condition',
    icon: 'air',
    hint: 'Altitude, Mach and length, or Reynolds; N_crit; sweep',
    runs: true,
    quick: true,
    references: {},
    fields: {
      mode: 'Flow given by',
      altitude_m: 'Altitude (m)',
      isaTemperatureOffset_K: 'ISA temperature offset (K)',
      mach: 'Mach number',
      referenceLength_m: 'Reference length (m)',
      reynolds: 'Reynolds number',
      turbulenceMode: 'Turbulence given by',
      turbulenceIntensity: 'Turbulence level',
      nCrit: 'N_crit',
      sweepDeg: 'Sweep (°)',
    },
    starter: { mode: 'altitude' },
  },
  pressure: {
    label: 'Pressure distribution',
    icon: 'ssid_chart',
    hint: 'Paste or upload a Cp table',
    runs: true,
    quick: true,
    references: {},
    fields: {
      text: 'Pressure table',
      uploadId: 'Uploaded file',
      filename: 'File name',
      layout: 'Table layout',
      surfaceName: 'Surface name',
      hasRadius: 'Last column is body radius',
      smoothing: 'Smoothing',
      smoothingHalfWidth: 'Smoothing half-width (points each side)',
    },
    starter: { text: '' },
  },
  section: {
    label: 'Section',
    icon: 'draw',
    hint: 'NACA designation or pasted coordinates; its Cp by the panel method',
    runs: true,
    quick: true,
    references: { flowCellId: { kinds: ['flow'], required: false } },
    fields: {
      source: 'Shape given by',
      naca: 'NACA designation',
      coordinates: 'Coordinates',
      flowCellId: 'Mach number from',
      at: 'Solve at',
      alphaDeg: 'Incidence (°)',
      cl: 'Lift coefficient',
      panels: 'Panels',
    },
    starter: { source: 'naca', naca: '2412' },
  },
  body: {
    label: 'Body of revolution',
    icon: 'radio_button_unchecked',
    hint: 'A nacelle or fuselage meridian, or a prolate spheroid; its Cp by the axisymmetric panel method',
    runs: true,
    quick: true,
    references: {},
    fields: {
      source: 'Shape given by',
      fineness: 'Fineness ratio (length / diameter)',
      coordinates: 'Meridian',
      panels: 'Panels',
    },
    starter: { source: 'spheroid', fineness: 6 },
  },
  analysis: {
    label: 'Transition analysis',
    icon: 'insights',
    hint: 'Boundary layer and transition along each surface',
    runs: true,
    quick: true,
    references: { flowCellId: { kinds: ['flow'], required: true }, pressureCellId: { kinds: ['pressure', 'section', 'body'], required: true } },
    fields: {
      flowCellId: 'Flow cell',
      pressureCellId: 'Pressure, section or body cell',
      criteria: 'Transition criteria',
      governing: 'Governing criterion',
      trips: 'Forced transition',
      turbulent: 'Turbulent march',
    },
    starter: { flowCellId: '', pressureCellId: '' },
  },
  polar: {
    label: 'Polar',
    icon: 'function',
    hint: 'Lift, drag and transition of a section over a range of incidence or lift',
    runs: true,
    quick: false,
    references: { flowCellId: { kinds: ['flow'], required: true }, sectionCellId: { kinds: ['section'], required: true } },
    fields: {
      flowCellId: 'Flow cell',
      sectionCellId: 'Section cell',
      by: 'Range of',
      from: 'From',
      to: 'To',
      points: 'Points',
      criteria: 'Transition criteria',
      governing: 'Governing criterion',
    },
    starter: { flowCellId: '', sectionCellId: '' },
  },
  flatPlate: {
    label: 'Flat-plate estimate',
    icon: 'straighten',
    hint: 'Laminar, turbulent and mixed skin friction',
    runs: true,
    quick: true,
    references: {},
    fields: {
      mode: 'Given as',
      reynolds: 'Reynolds number',
      length_m: 'Length (m)',
      speed_mps: 'Speed (m/s)',
      kinematicViscosity_m2s: 'Kinematic viscosity (m²/s)',
      transitionMode: 'Transition given by',
      transitionReynolds: 'Transition Reynolds number',
      transitionLocation: 'Transition location (x/L)',
    },
    starter: {},
  },
  leadingEdge: {
    label: 'Leading-edge check',
    icon: 'change_history',
    hint: 'Attachment-line Reynolds number and verdict',
    runs: true,
    quick: true,
    references: { flowCellId: { kinds: ['flow'], required: false } },
    fields: {
      flowCellId: 'Flow cell',
      sweepDeg: 'Sweep (°)',
      mode: 'Given as',
      leadingEdgeRadius: 'Leading-edge radius (r/L)',
      velocityGradient: 'Velocity gradient dUe/ds',
      reynolds: 'Reynolds number',
    },
    starter: {},
  },
  sweep: {
    label: 'Parameter sweep',
    icon: 'tune',
    hint: 'Re-run an analysis over a range of one parameter, or a grid of two',
    runs: true,
    quick: false,
    references: { analysisCellId: { kinds: ['analysis'], required: true } },
    fields: {
      analysisCellId: 'Analysis cell',
      parameter: 'Swept parameter',
      from: 'From',
      to: 'To',
      steps: 'Steps',
      second: 'Second parameter (grid)',
    },
    starter: { analysisCellId: '', parameter: 'nCrit', from: 7, to: 12, steps: 6 },
  },
  comparison: {
    label: 'Comparison',
    icon: 'stacked_line_chart',
    hint: 'Overlay the Cp, N-factor and H of several pressure cells or analyses',
    runs: true,
    quick: true,
    references: {
      firstCellId: { kinds: ['pressure', 'analysis'], required: true },
      secondCellId: { kinds: ['pressure', 'analysis'], required: true },
      thirdCellId: { kinds: ['pressure', 'analysis'], required: false },
      fourthCellId: { kinds: ['pressure', 'analysis'], required: false },
    },
    fields: { firstCellId: 'First cell', secondCellId: 'Second cell', thirdCellId: 'Third cell', fourthCellId: 'Fourth cell' },
    starter: { firstCellId: '', secondCellId: '' },
  },
  note: {
    label: 'Note',
    icon: 'notes',
    hint: 'Markdown text',
    runs: false,
    quick: false,
    references: {},
    fields: { markdown: 'Text' },
    starter: { markdown: '' },
  },
};

export function cellKindSpec(kind: CellKind): CellKindSpec {
  return CELL_KIND_REGISTRY[kind];
}

export function isCellKind(value: unknown): value is CellKind {
  return typeof value === 'string' && (CELL_KINDS as readonly string[]).includes(value);
}

/** The kinds offered when adding a cell, in the order a study is usually built. */
export const ADDABLE_KINDS: readonly CellKind[] = Object.keys(CELL_KIND_REGISTRY) as CellKind[];

/** Human names of the kinds, as the notebook shows them. */
export const CELL_KIND_LABELS: { readonly [K in CellKind]: string } = Object.fromEntries(CELL_KINDS.map((kind) => [kind, CELL_KIND_REGISTRY[kind].label])) as {
  [K in CellKind]: string;
};

/** What the notebook calls each input field, so a message or a difference reads "Reynolds number 6e6 → 9e6". */
export const FIELD_LABELS: { readonly [K in CellKind]: Readonly<Record<string, string>> } = Object.fromEntries(
  CELL_KINDS.map((kind) => [kind, CELL_KIND_REGISTRY[kind].fields]),
) as { [K in CellKind]: Record<string, string> };

/** The reference fields of a kind with what they may name, in the order the cell shows them. */
export function referenceFields(kind: CellKind): [field: string, reference: CellReference][] {
  return Object.entries(CELL_KIND_REGISTRY[kind].references);
}

/** Every input field of any kind that names another cell: shown by that cell's title. */
export const CELL_REFERENCE_FIELDS: ReadonlySet<string> = new Set(CELL_KINDS.flatMap((kind) => Object.keys(CELL_KIND_REGISTRY[kind].references)));

/** The cells a cell's inputs name (its upstream), in order. */
export function upstreamCellIds(kind: CellKind, inputs: Record<string, unknown>): string[] {
  return referenceFields(kind)
    .map(([field]) => inputs[field])
    .filter((id): id is string => typeof id === 'string' && id.length > 0);
}

/**
 * A kind's place in a run: 0 for a kind that names no other cell, else one more than the highest
 * place of the kinds it may name. Running by place computes every cell after the cells it uses.
 */
export const RUN_RANK: { readonly [K in CellKind]: number } = (() => {
  const rank = new Map<CellKind, number>();
  const visit = (kind: CellKind, path: CellKind[]): number => {
    const known = rank.get(kind);
    if (known !== undefined) return known;
    if (path.includes(kind)) throw new Error(`cell kinds name each other in a cycle: ${[...path, kind].join(' → ')}`);
    const named = referenceFields(kind).flatMap(([, ref]) => ref.kinds);
    const value = named.length === 0 ? 0 : 1 + Math.max(...named.map((k) => visit(k, [...path, kind])));
    rank.set(kind, value);
    return value;
  };
  return Object.fromEntries(CELL_KINDS.map((kind) => [kind, visit(kind, [])])) as { [K in CellKind]: number };
})();

/** The label of an input field (`trips.upper` reads "Forced transition: upper"). */
export function fieldLabel(kind: CellKind, path: string): string {
  const [head, ...rest] = path.split('.');
  const label = FIELD_LABELS[kind]?.[head!] ?? head!;
  return rest.length ? `${label}: ${rest.join('.')}` : label;
}

/** How the notebook words the choices an input field holds ("closedLoop" reads "closed loop"). */
export const VALUE_LABELS: Readonly<Record<string, Readonly<Record<string, string>>>> = {
  mode: { altitude: 'altitude, Mach, length', reynolds: 'Reynolds number', dimensional: 'length, speed, viscosity', radius: 'leading-edge radius', gradient: 'velocity gradient' },
  turbulenceMode: { nCrit: 'N_crit', intensity: 'turbulence level' },
  layout: { closedLoop: 'closed loop', surface: 'one surface' },
  smoothing: { off: 'off', auto: 'automatic', width: 'chosen width' },
  source: { naca: 'NACA designation', coordinates: 'coordinates', spheroid: 'prolate spheroid' },
  at: { alpha: 'incidence', cl: 'lift coefficient' },
  by: { alpha: 'incidence', cl: 'lift coefficient' },
  criteria: { eN: 'envelope eᴺ', crossflow: 'crossflow R_cf', crossflowC1: 'crossflow C1', michel: 'Michel', hRx: 'H–Re_x', granville: 'Granville' },
  governing: {
    auto: 'earlier of eᴺ and crossflow',
    earliest: 'earliest',
    eN: 'envelope eᴺ',
    crossflow: 'crossflow R_cf',
    crossflowC1: 'crossflow C1',
    michel: 'Michel',
    hRx: 'H–Re_x',
    granville: 'Granville',
  },
  parameter: { reynolds: 'Reynolds number', mach: 'Mach number', nCrit: 'N_crit', sweepDeg: 'sweep' },
  transitionMode: { reynolds: 'Reynolds number', location: 'location' },
};

export function valueLabel(field: string, value: string): string {
  return VALUE_LABELS[field.split('.')[0]!]?.[value] ?? value;
}

/** Field names in the order the notebook shows them for a kind, then any others. */
export function orderedFields(kind: CellKind, keys: Iterable<string>): string[] {
  const known = Object.keys(FIELD_LABELS[kind] ?? {});
  const all = [...keys];
  return [...known.filter((k) => all.includes(k)), ...all.filter((k) => !known.includes(k))];
}
