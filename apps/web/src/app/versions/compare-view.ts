import {
  type AnalysisComparison,
  type SweepComparison,
  type Delta,
  type Effect,
  type SurfaceComparison,
  type TransitionDelta,
  type VersionSummary,
} from '@laminote/contracts';
import { CAUSE_LABELS, CRITERION_LABELS } from '../shared/analysis-summary';
import { sci } from '../shared/format';
import { PARAMETER_LABELS } from '../shared/sweep-parameters';
import type { PlotFigure, PlotMarker } from '../shared/plot';

/**
 * The compare page's delta table and overlays, worked out from the server's comparison: each value in
 * both versions, the difference in the unit a designer reads (x/c, % of the run, drag counts), and a
 * cue saying what it means for the design.
 */

export interface DeltaRow {
  readonly quantity: string;
  readonly a: string;
  readonly b: string;
  readonly delta: string;
  readonly effect: Effect;
  /** What the change means, in words: "aft: longer laminar run". */
  readonly cue: string;
}

export interface SurfaceTable {
  readonly surface: string;
  readonly rows: readonly DeltaRow[];
}

const MINUS = '−';

function signedText(value: number | null, digits: number, unit = ''): string {
  if (value === null || !Number.isFinite(value)) return '—';
  const text = Math.abs(value).toFixed(digits) + unit;
  return value > 0 ? `+${text}` : value < 0 ? `${MINUS}${text}` : text;
}

function plain(value: number | null, digits: number, unit = ''): string {
  return value === null || !Number.isFinite(value) ? '—' : value.toFixed(digits).replace('-', MINUS) + unit;
}

const causeLabel = (by: string | null) => (by ? (CAUSE_LABELS[by as keyof typeof CAUSE_LABELS] ?? by) : null);

const SHIFT_CUES: Record<TransitionDelta['shift'], string> = {
  aft: 'aft: longer laminar run',
  forward: 'forward: shorter laminar run',
  appeared: 'transition now on the surface',
  vanished: 'laminar to the end now',
  none: 'no change',
};

function transitionRow(quantity: string, t: TransitionDelta, notReached: string): DeltaRow {
  const unit = t.coordinate === 'x' ? ' x/c' : ' s/c';
  const at = (value: number | null, by: string | null) => (value === null ? notReached : `${value.toFixed(3)}${by ? ` (${causeLabel(by)})` : ''}`);
  return { quantity, a: at(t.a, t.byA), b: at(t.b, t.byB), delta: t.delta === null ? '—' : signedText(t.delta, 3, unit), effect: t.effect, cue: SHIFT_CUES[t.shift] };
}

function extentRow(d: Delta): DeltaRow {
  const pct = (v: number | null) => (v === null ? null : v * 100);
  const cue = d.effect === 'favourable' ? 'more of the run laminar' : d.effect === 'adverse' ? 'less of the run laminar' : 'no change';
  return { quantity: 'Laminar extent (share of the run)', a: plain(pct(d.a), 1, ' %'), b: plain(pct(d.b), 1, ' %'), delta: signedText(pct(d.delta), 1, ' pts'), effect: d.effect, cue };
}

/** cd in drag counts (1 count = 0.0001), the unit drag is traded in. */
function dragRow(quantity: string, d: Delta): DeltaRow {
  const counts = (v: number | null) => (v === null ? null : v * 1e4);
  const cue = d.effect === 'favourable' ? 'drag down' : d.effect === 'adverse' ? 'drag up' : d.a === null && d.b === null ? 'not estimated' : 'no change';
  return { quantity, a: plain(counts(d.a), 2, ' cts'), b: plain(counts(d.b), 2, ' cts'), delta: signedText(counts(d.delta), 2, ' cts'), effect: d.effect, cue };
}

function separationRow(quantity: string, d: Delta, coordinate: 'x' | 's', adverseWords: [string, string]): DeltaRow {
  const unit = coordinate === 'x' ? ' x/c' : ' s/c';
  const at = (v: number | null) => (v === null ? 'none' : v.toFixed(3));
  let cue = 'no change';
  if (d.a === null && d.b !== null) cue = adverseWords[0];
  else if (d.a !== null && d.b === null) cue = adverseWords[1];
  else if (d.delta !== null && d.delta !== 0) cue = d.delta > 0 ? 'moved aft' : 'moved forward';
  return { quantity, a: at(d.a), b: at(d.b), delta: d.delta === null ? '—' : signedText(d.delta, 3, unit), effect: d.effect, cue };
}

export function surfaceTable(s: SurfaceComparison): SurfaceTable {
  const rows: DeltaRow[] = [transitionRow('Transition (governing)', s.transition, 'none: laminar to the end')];
  for (const c of s.criteria) rows.push(transitionRow(CRITERION_LABELS[c.criterion as keyof typeof CRITERION_LABELS] ?? c.criterion, c, 'not reached'));
  rows.push(extentRow(s.laminarExtent), dragRow('cd (Squire–Young)', s.cd), dragRow('cd friction', s.cdFriction));
  if (s.laminarSeparation.a !== null || s.laminarSeparation.b !== null) {
    rows.push(separationRow('Laminar separation', s.laminarSeparation, s.transition.coordinate, ['laminar separation now', 'no laminar separation now']));
  }
  if (s.turbulentSeparation.a !== null || s.turbulentSeparation.b !== null) {
    rows.push(separationRow('Turbulent separation', s.turbulentSeparation, s.transition.coordinate, ['turbulent separation now', 'no turbulent separation now']));
  }
  return { surface: s.name, rows };
}

export function versionLabel(v: VersionSummary): string {
  return `${v.branchName} v${v.number}`;
}

/** Version A drawn as a dashed slate line, B as a solid ink-teal one, on every overlay. */
export const A_COLOUR = '#5f6c7b';
export const B_COLOUR = '#1b5e66';

export interface OverlayFigure {
  readonly id: 'cp' | 'n' | 'h';
  readonly tab: string;
  readonly label: string;
  readonly figure: PlotFigure;
}

/** Cp, N-factor envelope and H of one surface in both versions, with each version's transition marked. */
export function overlayFigures(result: AnalysisComparison, s: SurfaceComparison, a: VersionSummary, b: VersionSummary): OverlayFigure[] {
  const x = { title: s.overlay.coordinate === 'x' ? 'x/c' : 's/c (arc length from the attachment line)' };
  const nameA = `A · ${versionLabel(a)}`;
  const nameB = `B · ${versionLabel(b)}`;
  const traces = (pick: (series: NonNullable<SurfaceComparison['overlay']['a']>) => readonly (number | null)[]) => [
    ...(s.overlay.a ? [{ x: s.overlay.a.x, y: pick(s.overlay.a), name: nameA, color: A_COLOUR, dash: 'dash' as const }] : []),
    ...(s.overlay.b ? [{ x: s.overlay.b.x, y: pick(s.overlay.b), name: nameB, color: B_COLOUR }] : []),
  ];
  const markers: PlotMarker[] = [
    ...(s.transition.a !== null ? [{ at: s.transition.a, axis: 'x' as const, label: 'A transition', color: A_COLOUR, dash: 'dot' as const }] : []),
    ...(s.transition.b !== null ? [{ at: s.transition.b, axis: 'x' as const, label: 'B transition', color: B_COLOUR, dash: 'dash' as const }] : []),
  ];
  const nCrit: PlotMarker[] = [
    ...(result.flow.nCrit.a !== null ? [{ at: result.flow.nCrit.a, axis: 'y' as const, label: `A N_crit ${result.flow.nCrit.a.toFixed(2)}`, color: A_COLOUR, dash: 'dot' as const }] : []),
    ...(result.flow.nCrit.b !== null && result.flow.nCrit.b !== result.flow.nCrit.a
      ? [{ at: result.flow.nCrit.b, axis: 'y' as const, label: `B N_crit ${result.flow.nCrit.b.toFixed(2)}`, color: B_COLOUR, dash: 'dot' as const }]
      : []),
  ];
  return [
    { id: 'cp', tab: 'Cp', label: `Pressure coefficient along the ${s.name} surface, versions A and B`, figure: { x, y: { title: 'Cp', reversed: true }, traces: traces((t) => t.cp), markers } },
    {
      id: 'n',
      tab: 'N-factor',
      label: `N-factor envelope along the ${s.name} surface, versions A and B, against N_crit`,
      figure: { x, y: { title: 'N (envelope amplification exponent)' }, traces: traces((t) => t.n), markers: [...markers, ...nCrit] },
    },
    { id: 'h', tab: 'H', label: `Shape factor H along the ${s.name} surface, versions A and B`, figure: { x, y: { title: 'H = δ*/θ' }, traces: traces((t) => t.H), markers } },
  ];
}

/** The flow condition each version ran at, as one line: "Re 4 × 10⁶ → 8 × 10⁶". */
export function flowChanges(result: AnalysisComparison, format: (v: number | null) => string): { label: string; a: string; b: string; changed: boolean }[] {
  const f = result.flow;
  return [
    { label: 'Reynolds number', a: format(f.reynolds.a), b: format(f.reynolds.b), changed: f.reynolds.a !== f.reynolds.b },
    { label: 'Mach number', a: plain(f.mach.a, 3), b: plain(f.mach.b, 3), changed: f.mach.a !== f.mach.b },
    { label: 'N_crit', a: plain(f.nCrit.a, 2), b: plain(f.nCrit.b, 2), changed: f.nCrit.a !== f.nCrit.b },
  ];
}

/** Whether an analysis gives the same numbers in both versions (nothing to read in its delta table). */
export function sameResults(r: AnalysisComparison): boolean {
  const same = (d: Delta) => d.a === d.b;
  return (
    r.statusA === r.statusB &&
    same(r.flow.reynolds) &&
    same(r.flow.mach) &&
    same(r.flow.nCrit) &&
    same(r.cd) &&
    r.surfaces.every((s) => [s.transition, ...s.criteria, s.laminarExtent, s.cd, s.cdFriction, s.laminarSeparation, s.turbulentSeparation].every(same))
  );
}

/** A sweep's steps as the compare page lists them: per step and surface, transition A → B and Δ; c_d in counts. */
export function sweepRows(s: SweepComparison): {
  parameter: string;
  surfaces: string[];
  rows: { value: string; cells: { ab: string; delta: string; effect: Effect }[] }[];
} {
  const parameter = s.parameter ? (PARAMETER_LABELS[s.parameter as keyof typeof PARAMETER_LABELS] ?? s.parameter) : 'Swept value';
  const surfaces = s.steps[0]?.surfaces.map((x) => x.name) ?? [];
  const location = (v: number | null) => (v === null ? '—' : v.toFixed(3));
  const counts = (v: number | null) => (v === null ? '—' : (v * 1e4).toFixed(2));
  return {
    parameter,
    surfaces,
    rows: s.steps.map((step) => ({
      value: s.parameter === 'reynolds' ? sci(step.value) : String(Number(step.value.toPrecision(6))),
      cells: [
        ...step.surfaces.map((x) => ({
          ab: `${location(x.transition.a)} → ${location(x.transition.b)}`,
          delta: signedText(x.transition.delta, 3, ` ${x.transition.coordinate === 'x' ? 'x/c' : 's'}`),
          effect: x.transition.effect,
        })),
        { ab: `${counts(step.cd.a)} → ${counts(step.cd.b)}`, delta: signedText(step.cd.delta === null ? null : step.cd.delta * 1e4, 2, ' cts'), effect: step.cd.effect },
      ],
    })),
  };
}

/** The governing transition of each surface against the swept value, A dashed and B solid. */
export function sweepFigure(s: SweepComparison, a: VersionSummary, b: VersionSummary): PlotFigure | null {
  if (s.steps.length === 0) return null;
  const x = s.steps.map((step) => step.value);
  const names = s.steps[0]!.surfaces.map((surface) => surface.name);
  const traces = names.flatMap((name, i) => {
    const at = (side: 'a' | 'b') => s.steps.map((step) => step.surfaces.find((x) => x.name === name)?.transition[side] ?? null);
    return [
      { x, y: at('a'), name: `A · ${versionLabel(a)} · ${name}`, color: A_COLOUR, dash: i === 0 ? ('dash' as const) : ('dot' as const), mode: 'lines+markers' as const },
      { x, y: at('b'), name: `B · ${versionLabel(b)} · ${name}`, color: B_COLOUR, dash: i === 0 ? ('solid' as const) : ('dashdot' as const), mode: 'lines+markers' as const },
    ];
  });
  const parameter = s.parameter ? (PARAMETER_LABELS[s.parameter as keyof typeof PARAMETER_LABELS] ?? s.parameter) : 'swept value';
  return { x: { title: parameter, log: s.parameter === 'reynolds' }, y: { title: 'governing transition x/c', range: [0, 1] }, traces };
}
