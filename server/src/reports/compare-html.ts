import { CELL_KIND_LABELS, transitionCauseLabel, type Comparison, type Delta, type TransitionDelta } from '@laminote/contracts';
import { when } from './format';
import { escapeHtml, reportStyle, tableHtml } from './html';
import { renderSvgPlot, type PlotSpec } from './svg-plot';

/** What a compare report needs beside the comparison itself. */
export interface CompareReportContext {
  project: string;
  studyTitle: string;
  generatedBy: string;
  engineVersion: string;
}

function num(value: number | null | undefined, digits = 4): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : Number(value.toPrecision(digits)).toString();
}

function signed(value: number | null, digits = 3): string {
  return value === null ? '—' : `${value > 0 ? '+' : ''}${num(value, digits)}`;
}

const EFFECT_WORDS: Record<string, string> = { favourable: 'favourable', adverse: 'adverse', neutral: '' };
const SHIFT_WORDS: Record<string, string> = { aft: 'aft', forward: 'forward', none: 'no change', appeared: 'appears in B', vanished: 'gone in B' };

function deltaRow(label: string, d: Delta, digits = 4): string[] {
  return [label, num(d.a, digits), num(d.b, digits), signed(d.delta), EFFECT_WORDS[d.effect] ?? d.effect];
}

function transitionRow(label: string, t: TransitionDelta): string[] {
  const where = (v: number | null, by: string | null) =>
    v === null ? 'stays laminar' : `${t.coordinate}${t.coordinate === 'x' ? '/c' : ''} = ${num(v)}${by ? ` (${transitionCauseLabel(by)})` : ''}`;
  return [label, where(t.a, t.byA), where(t.b, t.byB), `${signed(t.delta)} · ${SHIFT_WORDS[t.shift] ?? t.shift}`, EFFECT_WORDS[t.effect] ?? t.effect];
}

function cellName(title: string | null, kind: string): string {
  return title?.trim() || (CELL_KIND_LABELS as Record<string, string>)[kind] || kind;
}

/**
 * Two versions of one study compared, as one self-contained HTML file (same style, face and static SVG
 * plots as the version report, no script, nothing fetched): what changed cell by cell, and what it did to
 * transition and drag, with the caution.
 */
export function renderCompareReportHtml(c: Comparison, ctx: CompareReportContext): string {
  const side = (label: string, v: Comparison['a']) =>
    `<dt>${label}</dt><dd>v${v.number} on branch ${escapeHtml(v.branchName)}${v.isBaseline ? ' · baseline' : ''} — ${escapeHtml(v.author?.name ?? 'unknown')}, ${escapeHtml(when(v.createdAt))}: ${escapeHtml(v.message)}</dd>`;
  const title = `${ctx.studyTitle} — v${c.a.number} (${c.a.branchName}) against v${c.b.number} (${c.b.branchName})`;
  const changedCells = c.cells.filter((d) => d.change !== 'unchanged' || d.outputChanged);
  const cellsTable = changedCells.length
    ? tableHtml({
        caption: 'Cells that differ (A → B)',
        columns: ['Cell', 'Kind', 'Change', 'What differs'],
        rows: changedCells.map((d) => [
          cellName(d.titleB ?? d.titleA, d.kind),
          (CELL_KIND_LABELS as Record<string, string>)[d.kind] ?? d.kind,
          d.change + (d.moved && d.change !== 'moved' ? ', moved' : ''),
          [
            ...d.fields.map((f) => `${f.label}: ${f.oldText} → ${f.newText}`),
            ...(d.table ? d.table.surfaces.filter((s) => s.maxAbsDeltaCp !== null).map((s) => `${s.name}: largest |ΔCp| ${num(s.maxAbsDeltaCp, 3)} at x/c ${num(s.maxAt, 3)}`) : []),
            ...(d.text ? [`${d.text.linesAdded} lines added, ${d.text.linesRemoved} removed`] : []),
            ...(d.outputChanged ? ['results differ'] : []),
          ].join('; ') || '—',
        ]),
      })
    : '<p>The two versions hold the same cells with the same inputs and results.</p>';

  const results = c.results.map((r) => {
    const parts = [`<section class="cell" data-cell-id="${escapeHtml(r.cellId)}" data-kind="analysis"><div class="cell-head"><span class="cell-kind">Transition analysis</span><h3>${escapeHtml(r.title)}</h3></div>`];
    if (r.statusA !== 'ok' || r.statusB !== 'ok') {
      parts.push(`<p class="warnings">A: ${escapeHtml(r.errorA ?? r.statusA)} · B: ${escapeHtml(r.errorB ?? r.statusB)}</p>`);
    }
    const rows: string[][] = [deltaRow('Reynolds number', r.flow.reynolds), deltaRow('Mach number', r.flow.mach), deltaRow('N_crit', r.flow.nCrit), deltaRow('cd total', r.cd)];
    for (const s of r.surfaces) {
      rows.push(transitionRow(`${s.name}: transition`, s.transition));
      rows.push(deltaRow(`${s.name}: laminar extent`, s.laminarExtent, 3));
      rows.push(deltaRow(`${s.name}: cd`, s.cd));
      for (const k of s.criteria) rows.push(transitionRow(`${s.name}: ${transitionCauseLabel(k.criterion)}`, k));
    }
    parts.push(tableHtml({ caption: 'A, B, B − A and what the change means for the design', columns: ['Quantity', 'A', 'B', 'B − A', 'Effect'], rows, numeric: [1, 2] }));
    const plots: PlotSpec[] = r.surfaces.flatMap((s) => {
      const label = s.overlay.coordinate === 'x' ? 'x/c' : 's';
      const pair = (pick: 'cp' | 'n') =>
        [s.overlay.a ? { name: `A v${c.a.number}`, x: s.overlay.a.x, y: s.overlay.a[pick] } : null, s.overlay.b ? { name: `B v${c.b.number}`, x: s.overlay.b.x, y: s.overlay.b[pick] } : null].filter(
          (x): x is NonNullable<typeof x> => x !== null,
        );
      const markers = [
        ...(s.transition.a !== null ? [{ x: s.transition.a, label: 'A tr.' }] : []),
        ...(s.transition.b !== null ? [{ x: s.transition.b, label: 'B tr.' }] : []),
      ];
      return [
        { title: `${s.name}: Cp`, xLabel: label, yLabel: 'Cp', reverseY: true, series: pair('cp') },
        { title: `${s.name}: amplification N`, xLabel: label, yLabel: 'N', series: pair('n'), markers: s.overlay.coordinate === s.transition.coordinate ? markers : [] },
      ].filter((p) => p.series.length > 0);
    });
    if (plots.length) parts.push(`<div class="plots">${plots.map((p) => `<figure class="plot">${renderSvgPlot(p)}</figure>`).join('')}</div>`);
    const warnings = [...r.warningsA.map((w) => `A: ${w}`), ...r.warningsB.map((w) => `B: ${w}`)];
    if (warnings.length) parts.push(`<div class="warnings"><strong>Warnings</strong><ul>${warnings.map((w) => `<li>${escapeHtml(w)}</li>`).join('')}</ul></div>`);
    parts.push('</section>');
    return parts.join('');
  });

  const sweeps = c.sweeps.map((s) => {
    const names = [...new Set(s.steps.flatMap((st) => st.surfaces.map((x) => x.name)))];
    return `<section class="cell" data-cell-id="${escapeHtml(s.cellId)}" data-kind="sweep"><div class="cell-head"><span class="cell-kind">Parameter sweep</span><h3>${escapeHtml(s.title)}</h3></div>${tableHtml({
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
    })}</section>`;
  });

  const summary = c.summary;
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="Laminote engine ${escapeHtml(ctx.engineVersion)}">
<title>${escapeHtml(title)} · Laminote comparison</title>
<style>${reportStyle()}</style></head>
<body><main>
<p class="kicker">Laminote comparison report · ${escapeHtml(ctx.project)}</p>
<h1>${escapeHtml(title)}</h1>
<dl class="facts">
<dt>Study</dt><dd>${escapeHtml(ctx.studyTitle)}</dd>
${side('A', c.a)}
${side('B', c.b)}
<dt>Cells</dt><dd>${summary.changed} changed · ${summary.added} added · ${summary.removed} removed · ${summary.moved} moved · ${summary.unchanged} unchanged</dd>
<dt>Made</dt><dd>${escapeHtml(when(new Date().toISOString()))} by ${escapeHtml(ctx.generatedBy)} · Laminote engine ${escapeHtml(ctx.engineVersion)}</dd>
</dl>
<p class="caution" role="note"><strong>Caution.</strong> ${escapeHtml(c.caution)}</p>
<h2>What changed</h2>
${cellsTable}
<h2>Transition and drag, A against B</h2>
${results.length ? results.join('\n') : '<p>Neither version has a transition analysis to compare.</p>'}
${sweeps.length ? `<h2>Parameter sweeps</h2>\n${sweeps.join('\n')}` : ''}
<footer>Made by Laminote from versions ${escapeHtml(c.a.id)} (A) and ${escapeHtml(c.b.id)} (B); each version's own report holds every cell in full. Invented demo data is labelled as such in its study. ${escapeHtml(c.caution)}</footer>
</main></body></html>`;
}
