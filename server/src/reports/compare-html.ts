import type { CompareReportModel, CompareSection } from './compare-model';
import { when } from './format';
import { escapeHtml, reportStyle, tableHtml } from './html';
import { renderSvgPlot } from './svg-plot';

function sectionHtml(s: CompareSection): string {
  const parts = [`<section class="cell" data-cell-id="${escapeHtml(s.cellId)}" data-kind="${s.kind}"><div class="cell-head"><span class="cell-kind">${escapeHtml(s.kindLabel)}</span><h3>${escapeHtml(s.title)}</h3></div>`];
  if (s.note) parts.push(`<p class="warnings">${escapeHtml(s.note)}</p>`);
  parts.push(tableHtml(s.table));
  if (s.plots.length) parts.push(`<div class="plots">${s.plots.map((p) => `<figure class="plot">${renderSvgPlot(p)}</figure>`).join('')}</div>`);
  if (s.warnings.length) parts.push(`<div class="warnings"><strong>Warnings</strong><ul>${s.warnings.map((w) => `<li>${escapeHtml(w)}</li>`).join('')}</ul></div>`);
  parts.push('</section>');
  return parts.join('');
}

/**
 * Two versions of one study compared, as one self-contained HTML file (same style, face and static SVG
 * plots as the version report, no script, nothing fetched): what changed cell by cell, and what it did to
 * transition and drag, with the caution.
 */
export function renderCompareReportHtml(m: CompareReportModel): string {
  const [a, b] = m.sides;
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="Laminote engine ${escapeHtml(m.engineVersion)}">
<title>${escapeHtml(m.title)} · Laminote comparison</title>
<style>${reportStyle()}</style></head>
<body><main>
<p class="kicker">Laminote comparison report · ${escapeHtml(m.project)}</p>
<h1>${escapeHtml(m.title)}</h1>
<dl class="facts">
<dt>Study</dt><dd>${escapeHtml(m.studyTitle)}</dd>
${m.sides.map((s) => `<dt>${s.label}</dt><dd>${escapeHtml(s.text)}</dd>`).join('\n')}
<dt>Cells</dt><dd>${escapeHtml(m.cellCounts)}</dd>
<dt>Made</dt><dd>${escapeHtml(when(m.generatedAt))} by ${escapeHtml(m.generatedBy)} · Laminote engine ${escapeHtml(m.engineVersion)}</dd>
</dl>
<p class="caution" role="note"><strong>Caution.</strong> ${escapeHtml(m.caution)}</p>
<h2>What changed</h2>
${m.changes ? tableHtml(m.changes) : '<p>The two versions hold the same cells with the same inputs and results.</p>'}
<h2>Transition and drag, A against B</h2>
${m.results.length ? m.results.map(sectionHtml).join('\n') : '<p>Neither version has a transition analysis to compare.</p>'}
${m.sweeps.length ? `<h2>Parameter sweeps</h2>\n${m.sweeps.map(sectionHtml).join('\n')}` : ''}
<footer>Made by Laminote from versions ${escapeHtml(a.id)} (A) and ${escapeHtml(b.id)} (B); each version's own report holds every cell in full. Invented demo data is labelled as such in its study. ${escapeHtml(m.caution)}</footer>
</main></body></html>`;
}
