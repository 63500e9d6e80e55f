import { CELL_KIND_LABELS, transitionCauseLabel, type Comparison, type Delta, type TransitionDelta } from '@laminote/contracts';
import type { ReportTable } from './cell-sections';
import { fileSlug } from './model';
import { when } from './format';
import type { PlotSpec } from './svg-plot';

/** What a compare report needs beside the comparison itself. */
export interface CompareReportContext {
  project: string;
  studyTitle: string;
  generatedBy: string;
  engineVersion: string;
}

/** One side of the comparison in a line: which version, whose, when, why. */
export interface CompareSide {
  label: 'A' | 'B';
  id: string;
  text: string;
}

/** One compared analysis, or one compared sweep: a heading, its table, its plots and warnings. */
export interface CompareSection {
  cellId: string;
  kind: 'analysis' | 'sweep';
  kindLabel: string;
  title: string;
  /** A line said before the table (a side that failed), or null. */
  note: string | null;
  table: ReportTable;
  plots: PlotSpec[];
  warnings: string[];
}

/**
 * Everything a compare report shows, gathered once and drawn as HTML (compare-html.ts) or PDF (pdf.ts),
 * so the two cannot differ in content.
 */
export interface CompareReportModel {
  project: string;
  studyTitle: string;
  title: string;
  sides: [CompareSide, CompareSide];
  cellCounts: string;
  /** The cells that differ, or null when the versions hold the same cells, inputs and results. */
  changes: ReportTable | null;
  results: CompareSection[];
  sweeps: CompareSection[];
  caution: string;
  engineVersion: string;
  generatedAt: string;
  generatedBy: string;
  /** The file name without its extension. */
  fileBase: string;
}

function num(value: number | null | undefined, digits = 4): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : Number(value.toPrecision(digits)).toString();
}

function signed(value: number | null, digits = 3): string {
  return value === null ? '—' : `${value > 0 ? '+' : ''}${num(value, digits)}`;
}

const EFFECT_WORDS: Record<string, string> = { favourable: 'favourable', adverse: 'adverse', neutral: '' };
const SHIFT_WORDS: Record<string, string> = { aft: 'aft', forward: 'forward', none: 'no change', appeared: 'appears in B', vanished: 'gone in B' };
const kindLabel = (kind: string) => (CELL_KIND_LABELS as Record<string, string>)[kind] ?? kind;

function deltaRow(label: string, d: Delta, digits = 4): string[] {
  return [label, num(d.a, digits), num(d.b, digits), signed(d.delta), EFFECT_WORDS[d.effect] ?? d.effect];
}

function transitionRow(label: string, t: TransitionDelta): string[] {
  const where = (v: number | null, by: string | null) =>
    v === null ? 'stays laminar' : `${t.coordinate}${t.coordinate === 'x' ? '/c' : ''} = ${num(v)}${by ? ` (${transitionCauseLabel(by)})` : ''}`;
  return [label, where(t.a, t.byA), where(t.b, t.byB), `${signed(t.delta)} · ${SHIFT_WORDS[t.shift] ?? t.shift}`, EFFECT_WORDS[t.effect] ?? t.effect];
}

function side(label: 'A' | 'B', v: Comparison['a']): CompareSide {
  return { label, id: v.id, text: `v${v.number} on branch ${v.branchName}${v.isBaseline ? ' · baseline' : ''} — ${v.author?.name ?? 'unknown'}, ${when(v.createdAt)}: ${v.message}` };
}

function changesTable(c: Comparison): ReportTable | null {
  const changed = c.cells.filter((d) => d.change !== 'unchanged' || d.outputChanged);
  if (!changed.length) return null;
  return {
    caption: 'Cells that differ (A → B)',
    columns: ['Cell', 'Kind', 'Change', 'What differs'],
    rows: changed.map((d) => [
      (d.titleB ?? d.titleA)?.trim() || kindLabel(d.kind),
      kindLabel(d.kind),
      d.change + (d.moved && d.change !== 'moved' ? ', moved' : ''),
      [
        ...d.fields.map((f) => `${f.label}: ${f.oldText} → ${f.newText}`),
        ...(d.table ? d.table.surfaces.filter((s) => s.maxAbsDeltaCp !== null).map((s) => `${s.name}: largest |ΔCp| ${num(s.maxAbsDeltaCp, 3)} at x/c ${num(s.maxAt, 3)}`) : []),
        ...(d.text ? [`${d.text.linesAdded} lines added, ${d.text.linesRemoved} removed`] : []),
        ...(d.outputChanged ? ['results differ'] : []),
      ].join('; ') || '—',
    ]),
  };
}

function analysisSection(c: Comparison, r: Comparison['results'][number]): CompareSection {
  const rows: string[][] = [deltaRow('Reynolds number', r.flow.reynolds), deltaRow('Mach number', r.flow.mach), deltaRow('N_crit', r.flow.nCrit), deltaRow('cd total', r.cd)];
  for (const s of r.surfaces) {
    rows.push(transitionRow(`${s.name}: transition`, s.transition));
    rows.push(deltaRow(`${s.name}: laminar extent`, s.laminarExtent, 3));
    rows.push(deltaRow(`${s.name}: cd`, s.cd));
    for (const k of s.criteria) rows.push(transitionRow(`${s.name}: ${transitionCauseLabel(k.criterion)}`, k));
  }
  const plots: PlotSpec[] = r.surfaces.flatMap((s) => {
    const label = s.overlay.coordinate === 'x' ? 'x/c' : 's';
    const pair = (pick: 'cp' | 'n') =>
      [s.overlay.a ? { name: `A v${c.a.number}`, x: s.overlay.a.x, y: s.overlay.a[pick] } : null, s.overlay.b ? { name: `B v${c.b.number}`, x: s.overlay.b.x, y: s.overlay.b[pick] } : null].filter(
        (x): x is NonNullable<typeof x> => x !== null,
      );
    const markers = [...(s.transition.a !== null ? [{ x: s.transition.a, label: 'A tr.' }] : []), ...(s.transition.b !== null ? [{ x: s.transition.b, label: 'B tr.' }] : [])];
    return [
      { title: `${s.name}: Cp`, xLabel: label, yLabel: 'Cp', reverseY: true, series: pair('cp') },
      { title: `${s.name}: amplification N`, xLabel: label, yLabel: 'N', series: pair('n'), markers: s.overlay.coordinate === s.transition.coordinate ? markers : [] },
    ].filter((p) => p.series.length > 0);
  });
  return {
    cellId: r.cellId,
    kind: 'analysis',
    kindLabel: kindLabel('analysis'),
    title: r.title,
    note: r.statusA !== 'ok' || r.statusB !== 'ok' ? `A: ${r.errorA ?? r.statusA} · B: ${r.errorB ?? r.statusB}` : null,
    table: { caption: 'A, B, B − A and what the change means for the design', columns: ['Quantity', 'A', 'B', 'B − A', 'Effect'], rows, numeric: [1, 2] },
    plots,
    warnings: [...r.warningsA.map((w) => `A: ${w}`), ...r.warningsB.map((w) => `B: ${w}`)],
  };
}

function sweepSection(s: Comparison['sweeps'][number]): CompareSection {
  const names = [...new Set(s.steps.flatMap((st) => st.surfaces.map((x) => x.name)))];
  return {
    cellId: s.cellId,
    kind: 'sweep',
    kindLabel: kindLabel('sweep'),
    title: s.title,
    note: null,
    table: {
      caption: `${s.parameter ?? 'value'} step by step${s.resultsDiffer ? '' : ' (results the same in both)'}`,
      columns: [s.parameter ?? 'value', 'cd A', 'cd B', ...names.flatMap((n) => [`${n} tr. A`, `${n} tr. B`])],
      numeric: [0, 1, 2],
      rows: s.steps.map((st) => [
        num(st.value),
        num(st.cd.a),
        num(st.cd.b),
        ...names.flatMap((n) => {
          const t = st.surfaces.find((x) => x.name === n)?.transition;
          return [num(t?.a ?? null), num(t?.b ?? null)];
        }),
      ]),
    },
    plots: [],
    warnings: [],
  };
}

export function buildCompareReport(c: Comparison, ctx: CompareReportContext, now = new Date()): CompareReportModel {
  const s = c.summary;
  return {
    project: ctx.project,
    studyTitle: ctx.studyTitle,
    title: `${ctx.studyTitle} — v${c.a.number} (${c.a.branchName}) against v${c.b.number} (${c.b.branchName})`,
    sides: [side('A', c.a), side('B', c.b)],
    cellCounts: `${s.changed} changed · ${s.added} added · ${s.removed} removed · ${s.moved} moved · ${s.unchanged} unchanged`,
    changes: changesTable(c),
    results: c.results.map((r) => analysisSection(c, r)),
    sweeps: c.sweeps.map(sweepSection),
    caution: c.caution,
    engineVersion: ctx.engineVersion,
    generatedAt: now.toISOString(),
    generatedBy: ctx.generatedBy,
    fileBase: fileSlug(`${ctx.studyTitle} v${c.a.number} against v${c.b.number}`) || 'laminote-comparison',
  };
}
