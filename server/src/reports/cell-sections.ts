import {
  CELL_KIND_LABELS,
  CELL_REFERENCE_FIELDS,
  fieldLabel,
  isCellKind,
  orderedFields,
  transitionCauseLabel,
  valueLabel,
  type AnalysisResult,
  type BodyResult,
  type CellKind,
  type FlatPlateResult,
  type FlowResult,
  type LeadingEdgeResult,
  type PressureResult,
  type SweepResult,
  type VersionCell,
} from '@laminote/contracts';
import { resultMethods } from '@laminote/aero';
import type { PlotSpec } from './svg-plot';

/**
 * What a report shows of one cell, independent of how it is drawn: the HTML and the PDF renderers both
 * read this, so they cannot differ in content.
 */
export interface ReportTable {
  caption?: string;
  columns: string[];
  rows: string[][];
  /** Columns (by index) that hold numbers: set right-aligned in a monospaced face. */
  numeric?: number[];
}

export interface ReportCell {
  cellId: string;
  position: number;
  kind: string;
  kindLabel: string;
  title: string;
  /** Input fields as label → value; long text (a pasted table, a note) goes to `texts`. */
  inputs: [label: string, value: string][];
  texts: { label: string; text: string }[];
  status: 'ok' | 'error' | 'notRun';
  error: string | null;
  tables: ReportTable[];
  plots: PlotSpec[];
  warnings: string[];
  /** Ids of the methods (libs/aero/src/methods) its numbers come from. */
  methods: string[];
  outputKey: string | null;
  engineVersion: string | null;
  computedAt: string | null;
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

function superscript(n: number): string {
  return [...String(n)].map((c) => SUPERSCRIPT[c] ?? c).join('');
}

export function num(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e5 || magnitude < 1e-3) {
    const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
    return `${mantissa} × 10${superscript(Number(exponent))}`;
  }
  return Number(value.toPrecision(digits)).toString();
}

const VERDICT_WORDS: Record<string, string> = { laminar: 'stays laminar', contaminationRisk: 'contamination risk', unstable: 'unstable (turbulent)' };
const LONG_TEXT = 160;

function inputValue(field: string, value: unknown, titles: ReadonlyMap<string, string>): string {
  if (value === null || value === undefined || value === '') return '—';
  if (CELL_REFERENCE_FIELDS.has(field) && typeof value === 'string') return titles.get(value) ?? '(a cell not in this version)';
  if (typeof value === 'number') return num(value, 6);
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return valueLabel(field, value);
  if (Array.isArray(value)) return value.map((v) => (typeof v === 'string' ? valueLabel(field, v) : inputValue(field, v, titles))).join(', ');
  if (typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>);
    return entries.length ? entries.map(([k, v]) => `${k}: ${inputValue(field, v, titles)}`).join('; ') : '—';
  }
  return String(value);
}

function describeInputs(kind: string, inputs: Record<string, unknown>, titles: ReadonlyMap<string, string>) {
  const rows: [string, string][] = [];
  const texts: { label: string; text: string }[] = [];
  const known = isCellKind(kind);
  for (const field of known ? orderedFields(kind, Object.keys(inputs)) : Object.keys(inputs)) {
    const label = known ? fieldLabel(kind as CellKind, field) : field;
    const value = inputs[field];
    if (typeof value === 'string' && (value.length > LONG_TEXT || value.includes('\n'))) texts.push({ label, text: value });
    else rows.push([label, inputValue(field, value, titles)]);
  }
  return { rows, texts };
}

/** x/c where the table gave x, else the arc length s (both divided by the reference length). */
function stationAxis(surface: AnalysisResult['surfaces'][number]): { values: number[]; label: string } {
  const x = surface.stations.x;
  return x && x.length === surface.stations.s.length ? { values: x, label: 'x/c' } : { values: surface.stations.s, label: 's/L' };
}

function atStation(surface: AnalysisResult['surfaces'][number], s: number | null | undefined): string {
  if (s === null || s === undefined) return '—';
  const x = surface.stations.x;
  if (!x || x.length !== surface.stations.s.length) return `s = ${num(s, 3)}`;
  const st = surface.stations.s;
  let i = 1;
  while (i < st.length - 1 && st[i]! < s) i++;
  const t = st[i] === st[i - 1] ? 0 : (s - st[i - 1]!) / (st[i]! - st[i - 1]!);
  return `x/c = ${num(x[i - 1]! + t * (x[i]! - x[i - 1]!), 3)}`;
}

function flowSections(r: FlowResult): Pick<ReportCell, 'tables'> {
  const rows: [string, string][] = [
    ['Reynolds number', num(r.reynolds)],
    ['Mach number', num(r.mach)],
    ['Reynolds number per metre', num(r.reynoldsPerMetre)],
    ['Speed (m/s)', num(r.speed_mps)],
    ['Kinematic viscosity (m²/s)', num(r.kinematicViscosity_m2s)],
    ['Dynamic pressure (Pa)', num(r.dynamicPressure_Pa)],
    ['Temperature (K)', num(r.temperature_K)],
    ['Pressure (Pa)', num(r.pressure_Pa)],
    ['Density (kg/m³)', num(r.density_kgm3)],
    ['Speed of sound (m/s)', num(r.speedOfSound_mps)],
    ['N_crit', `${num(r.nCrit, 3)} (${r.nCritFrom === 'turbulenceIntensity' ? 'from the turbulence level, Mack' : 'given'})`],
    ['Sweep (°)', num(r.sweepDeg)],
  ];
  return { tables: [{ caption: 'Free stream', columns: ['Quantity', 'Value'], rows, numeric: [1] }] };
}

function pressureSections(r: PressureResult): Pick<ReportCell, 'tables' | 'plots'> {
  const rows: [string, string][] = [
    ['Layout', r.layout === 'closedLoop' ? 'closed loop' : 'one surface'],
    ['Rows read', String(r.rowCount)],
    ['Surfaces', r.surfaces.map((s) => `${s.name} (${s.x.length} points)`).join(', ')],
    ['Stagnation point', r.stagnation ? `x/c = ${num(r.stagnation.x)}, dUe/ds = ${num(r.stagnation.velocityGradient)}` : '—'],
    ['Lowest Cp', `${num(r.cpMin.cp)} at x/c = ${num(r.cpMin.x)} (${r.cpMin.surface})`],
  ];
  const plots: PlotSpec[] = [{ title: 'Pressure distribution', xLabel: 'x/c', yLabel: 'Cp', reverseY: true, series: r.surfaces.map((s) => ({ name: s.name, x: s.x, y: s.cp })) }];
  return { tables: [{ caption: 'Table as read', columns: ['Quantity', 'Value'], rows }], plots };
}

function bodySections(r: BodyResult): Pick<ReportCell, 'tables' | 'plots'> {
  const rows: [string, string][] = [
    ['Shape', r.title ?? 'pasted meridian'],
    ['Fineness ratio L/D', num(r.geometry.fineness)],
    ['Maximum radius r/L', `${num(r.geometry.maxRadius)} at x/L = ${num(r.geometry.maxRadiusAt, 3)}`],
    ['Panels', String(r.inviscid.panels)],
  ];
  const plots: PlotSpec[] = [
    { title: 'Meridian', xLabel: 'x/L', yLabel: 'r/L', series: [{ name: 'r', x: r.outline.x, y: r.outline.r }] },
    { title: 'Pressure distribution (axisymmetric panel method, incompressible)', xLabel: 'x/L', yLabel: 'Cp', reverseY: true, series: [{ name: 'Cp', x: r.inviscid.x, y: r.inviscid.cp }] },
  ];
  return { tables: [{ caption: 'Body of revolution at zero incidence', columns: ['Quantity', 'Value'], rows }], plots };
}

function analysisSections(r: AnalysisResult): Pick<ReportCell, 'tables' | 'plots'> {
  const summary: ReportTable = {
    caption: 'Transition, separation and drag per surface',
    columns: ['Surface', 'Transition', 'Set by', 'Laminar separation', 'Turbulent separation', 'cd', 'cd friction'],
    numeric: [5, 6],
    rows: r.surfaces.map((s) => [
      s.name,
      atStation(s, s.transition.s),
      s.transition.by ? transitionCauseLabel(s.transition.by) : 'stays laminar',
      atStation(s, s.laminarSeparation?.s),
      atStation(s, s.turbulentSeparation?.s),
      num(s.cd),
      num(s.cdFriction),
    ]),
  };
  summary.rows.push(['total', '', '', '', '', num(r.cd), '']);
  const criteria = [...new Set(r.surfaces.flatMap((s) => Object.keys(s.transition.criteria)))];
  const criteriaTable: ReportTable = {
    caption: 'Every chosen criterion (the governing one sets transition; the others are cross-checks)',
    columns: ['Surface', 'Criterion', 'Location', 'Re_θ', 'Re_s'],
    numeric: [3, 4],
    rows: r.surfaces.flatMap((s) =>
      criteria.map((c) => {
        const hit = (s.transition.criteria as Record<string, { s: number; reTheta: number; reS: number } | null | undefined>)[c];
        return [s.name, transitionCauseLabel(c), hit ? atStation(s, hit.s) : 'not reached', num(hit?.reTheta), num(hit?.reS)];
      }),
    ),
  };
  const flow: ReportTable = {
    caption: 'Flow used',
    columns: ['Quantity', 'Value'],
    numeric: [1],
    rows: [
      ['Reynolds number', num(r.flow.reynolds)],
      ['Mach number', num(r.flow.mach)],
      ['N_crit', `${num(r.flow.nCrit, 3)} (${r.flow.nCritFrom})`],
      ...(r.attachmentLine ? [['Attachment line R̄ (Poll)', `${num(r.attachmentLine.reBar)} — ${VERDICT_WORDS[r.attachmentLine.verdict] ?? r.attachmentLine.verdict}`]] : []),
    ],
  };
  const markers = r.surfaces.flatMap((s) => {
    if (s.transition.s === null) return [];
    const axis = stationAxis(s);
    const i = s.stations.s.findIndex((v) => v >= s.transition.s!);
    return i >= 0 ? [{ x: axis.values[i]!, label: `${s.name} tr.` }] : [];
  });
  const xLabel = r.surfaces[0] ? stationAxis(r.surfaces[0]).label : 'x/c';
  const series = (pick: (s: AnalysisResult['surfaces'][number]) => (number | null)[]) => r.surfaces.map((s) => ({ name: s.name, x: stationAxis(s).values, y: pick(s) }));
  const plots: PlotSpec[] = [
    { title: 'Amplification N (envelope eᴺ)', xLabel, yLabel: 'N', series: series((s) => s.stations.n), markers },
    { title: 'Shape factor H', xLabel, yLabel: 'H', series: series((s) => s.stations.H), markers },
    { title: 'Skin friction cf', xLabel, yLabel: 'cf', series: series((s) => s.stations.cf), markers },
  ];
  return { tables: [summary, criteriaTable, flow], plots };
}

function sweepSections(r: SweepResult): Pick<ReportCell, 'tables' | 'plots'> {
  const names = [...new Set(r.steps.flatMap((s) => s.surfaces.map((x) => x.name)))];
  const table: ReportTable = {
    caption: `Sweep of ${valueLabel('parameter', r.parameter)}`,
    columns: [valueLabel('parameter', r.parameter), 'Reynolds number', ...names.map((n) => `${n}: transition`), 'cd'],
    numeric: [0, 1, names.length + 2],
    rows: r.steps.map((step) => [
      num(step.value),
      num(step.reynolds),
      ...names.map((n) => {
        if (step.status === 'error') return step.error?.message ?? 'error';
        const s = step.surfaces.find((x) => x.name === n);
        if (!s) return '—';
        const where = s.transitionX !== null ? `x/c = ${num(s.transitionX, 3)}` : s.transitionS !== null ? `s = ${num(s.transitionS, 3)}` : 'stays laminar';
        return s.by ? `${where} (${transitionCauseLabel(s.by)})` : where;
      }),
      num(step.cd),
    ]),
  };
  const plots: PlotSpec[] = [
    {
      title: 'Transition against the swept parameter',
      xLabel: valueLabel('parameter', r.parameter),
      yLabel: 'transition (x/c, or s/L)',
      series: names.map((n) => ({
        name: n,
        x: r.steps.map((s) => s.value),
        y: r.steps.map((s) => {
          const hit = s.surfaces.find((x) => x.name === n);
          return hit?.transitionX ?? hit?.transitionS ?? null;
        }),
      })),
    },
    { title: 'Profile drag against the swept parameter', xLabel: valueLabel('parameter', r.parameter), yLabel: 'cd', series: [{ name: 'cd', x: r.steps.map((s) => s.value), y: r.steps.map((s) => s.cd) }] },
  ];
  return { tables: [table], plots };
}

function flatPlateSections(r: FlatPlateResult): Pick<ReportCell, 'tables'> {
  const rows: [string, string][] = [
    ['Reynolds number', num(r.reynolds)],
    ['Transition Reynolds number', num(r.transitionReynolds)],
    ['Transition location (x/L)', num(r.transitionLocation)],
    ['CF laminar (Blasius)', num(r.cfLaminar)],
    ['CF turbulent (Schlichting)', num(r.cfTurbulent)],
    ['CF turbulent (Prandtl)', num(r.cfTurbulentPrandtl)],
    ['CF mixed', num(r.cfMixed)],
    ['δ/L laminar, turbulent', `${num(r.deltaLaminar)}, ${num(r.deltaTurbulent)}`],
    ['Friction saved by the laminar run', `${num(r.laminarSaving * 100, 3)} %`],
  ];
  return { tables: [{ caption: 'Mean friction per side on the free-stream dynamic pressure', columns: ['Quantity', 'Value'], rows, numeric: [1] }] };
}

function leadingEdgeSections(r: LeadingEdgeResult): Pick<ReportCell, 'tables'> {
  const rows: [string, string][] = [
    ['Reynolds number', num(r.reynolds)],
    ['Sweep (°)', num(r.sweepDeg)],
    ['Attachment-line Reynolds number R̄', num(r.reBar)],
    ['Verdict', VERDICT_WORDS[r.verdict] ?? r.verdict],
    ['From', r.from === 'leadingEdgeRadius' ? 'leading-edge radius' : 'velocity gradient'],
    ['Thresholds (Poll)', `${r.thresholds.contamination} (contamination), ${r.thresholds.instability} (instability)`],
  ];
  return { tables: [{ caption: 'Attachment line', columns: ['Quantity', 'Value'], rows, numeric: [1] }] };
}

/** Scalars of a result of a kind this report does not know yet, so nothing is left out. */
function genericSections(result: unknown): Pick<ReportCell, 'tables'> {
  const rows: [string, string][] = [];
  const walk = (value: unknown, path: string, depth: number) => {
    if (depth > 4 || rows.length > 200) return;
    if (typeof value === 'number') rows.push([path, num(value)]);
    else if (typeof value === 'string' || typeof value === 'boolean') rows.push([path, String(value)]);
    else if (Array.isArray(value)) {
      if (value.every((v) => typeof v === 'number' || v === null)) rows.push([path, `${value.length} values`]);
      else value.forEach((v, i) => walk(v, `${path}[${i}]`, depth + 1));
    } else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) walk(v, path ? `${path}.${k}` : k, depth + 1);
  };
  walk(result, '', 0);
  return { tables: rows.length ? [{ caption: 'Result', columns: ['Quantity', 'Value'], rows }] : [] };
}

export function describeCell(cell: VersionCell, titles: ReadonlyMap<string, string>): ReportCell {
  const kind = cell.kind as string;
  const { rows, texts } = describeInputs(kind, cell.inputs, titles);
  const output = cell.output;
  const base: ReportCell = {
    cellId: cell.cellId,
    position: cell.position,
    kind,
    kindLabel: isCellKind(kind) ? CELL_KIND_LABELS[kind] : kind,
    title: cell.title,
    inputs: rows,
    texts,
    status: kind === 'note' ? 'ok' : output ? output.status : 'notRun',
    error: output?.status === 'error' ? [output.error?.message, output.error?.field ? `(${output.error.field})` : ''].filter(Boolean).join(' ') : null,
    tables: [],
    plots: [],
    warnings: [],
    methods: [],
    outputKey: output?.key ?? cell.outputKey,
    engineVersion: output?.engineVersion ?? null,
    computedAt: output?.computedAt ?? null,
  };
  if (!output || output.status !== 'ok' || output.result === null) return base;
  const result = output.result as Record<string, unknown>;
  const warnings = Array.isArray(result['warnings']) ? (result['warnings'] as unknown[]).map(String) : [];
  const parts = (() => {
    switch (kind) {
      case 'flow':
        return flowSections(result as unknown as FlowResult);
      case 'pressure':
        return pressureSections(result as unknown as PressureResult);
      case 'body':
        return bodySections(result as unknown as BodyResult);
      case 'analysis':
        return analysisSections(result as unknown as AnalysisResult);
      case 'sweep':
        return sweepSections(result as unknown as SweepResult);
      case 'flatPlate':
        return flatPlateSections(result as unknown as FlatPlateResult);
      case 'leadingEdge':
        return leadingEdgeSections(result as unknown as LeadingEdgeResult);
      default:
        return genericSections(result);
    }
  })();
  // The same methods the notebook links under the result (libs/aero resultMethods).
  return { ...base, ...parts, warnings, methods: resultMethods(kind, result).map((m) => m.id) };
}
