import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { ReportCell, ReportTable } from './cell-sections';
import { when } from './format';
import type { VersionReportModel } from './model';
import { renderSvgPlot } from './svg-plot';

/**
 * The version report as one self-contained HTML file: styles, the Lato text face (as data) and every
 * plot (inline SVG) are inside it, with no script and nothing fetched, so it can be mailed and opened
 * offline by someone without an account, and prints as it reads.
 */
const require = createRequire(import.meta.url);

function fontFace(weight: number): string {
  try {
    const file = require.resolve(`@fontsource/lato/files/lato-latin-${weight}-normal.woff2`);
    return `@font-face{font-family:Lato;font-weight:${weight};font-style:normal;src:url(data:font/woff2;base64,${readFileSync(file).toString('base64')}) format('woff2');}`;
  } catch {
    return '';
  }
}

let fonts: string | null = null;

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

const STYLE = `
:root{color-scheme:light}
body{font-family:Lato,'DejaVu Sans',Helvetica,Arial,sans-serif;color:#1b1b1f;margin:0;background:#fff;font-size:14px;line-height:1.45}
main{max-width:980px;margin:0 auto;padding:32px 40px 48px}
h1{font-size:26px;margin:0 0 4px}
h2{font-size:19px;margin:28px 0 8px;border-bottom:2px solid #1f5f8b;padding-bottom:4px}
h3{font-size:15px;margin:16px 0 6px}
.kicker{color:#44474e;margin:0;font-size:13px}
.facts{display:grid;grid-template-columns:max-content 1fr;gap:2px 16px;margin:12px 0}
.facts dt{color:#44474e}
.facts dd{margin:0}
.caution{border-left:4px solid #c0562a;background:#fbf1ec;padding:10px 14px;margin:16px 0}
table{border-collapse:collapse;width:100%;margin:6px 0 12px;font-size:13px}
th,td{border-bottom:1px solid #d5d6dc;padding:4px 8px;text-align:left;vertical-align:top}
th{background:#f1f2f6;font-weight:700;color:#2b2d33}
td.num{text-align:right;font-family:'JetBrains Mono','DejaVu Sans Mono',monospace;white-space:nowrap}
caption{caption-side:top;text-align:left;font-weight:700;padding:4px 0;color:#2b2d33}
.cell{break-inside:auto;margin-top:28px;border-top:1px solid #b9bbc4;padding-top:10px}
.cell-head{display:flex;gap:12px;align-items:baseline;flex-wrap:wrap}
.cell-kind{font-size:12px;text-transform:uppercase;letter-spacing:.05em;color:#1f5f8b;font-weight:700}
.provenance{font-size:11px;color:#5d5f66;font-family:'JetBrains Mono','DejaVu Sans Mono',monospace;word-break:break-all}
pre{font-family:'JetBrains Mono','DejaVu Sans Mono',monospace;font-size:11px;background:#f6f7f9;border:1px solid #e0e1e6;padding:8px;white-space:pre-wrap;word-break:break-all}
pre.note-text{font-family:inherit;font-size:14px;background:none;border:none;padding:0;word-break:normal}
.plots{display:grid;grid-template-columns:1fr;gap:8px}
.plot svg{width:100%;height:auto;max-width:640px;border:1px solid #e0e1e6}
.warnings{background:#fff7e0;border-left:4px solid #9a7b1c;padding:6px 12px;margin:8px 0}
.error{background:#fde8e7;border-left:4px solid #b3261e;padding:6px 12px}
.verdict-old{color:#5d5f66}
.method{margin:10px 0 14px}
.method p{margin:2px 0}
footer{margin-top:32px;font-size:12px;color:#5d5f66;border-top:1px solid #d5d6dc;padding-top:8px}
@media print{main{padding:0;max-width:none}h2{break-after:avoid}.plot,table{break-inside:avoid}a{color:inherit;text-decoration:none}}
@page{size:A4;margin:16mm 14mm}
`;

/** The report's style sheet with the Lato face inside, for every report this folder writes. */
export function reportStyle(): string {
  fonts ??= fontFace(400) + fontFace(700);
  return fonts + STYLE;
}

export function tableHtml(t: ReportTable): string {
  const numeric = new Set(t.numeric ?? []);
  const head = t.columns.map((c) => `<th scope="col">${escapeHtml(c)}</th>`).join('');
  const body = t.rows.map((r) => `<tr>${r.map((v, i) => `<td${numeric.has(i) ? ' class="num"' : ''}>${escapeHtml(v)}</td>`).join('')}</tr>`).join('');
  return `<table>${t.caption ? `<caption>${escapeHtml(t.caption)}</caption>` : ''}<thead><tr>${head}</tr></thead><tbody>${body}</tbody></table>`;
}

function cellHtml(cell: ReportCell, index: number, methodNames: ReadonlyMap<string, string>): string {
  const parts: string[] = [];
  parts.push(`<section class="cell" id="cell-${escapeHtml(cell.cellId)}" data-cell-id="${escapeHtml(cell.cellId)}" data-kind="${escapeHtml(cell.kind)}">`);
  parts.push(`<div class="cell-head"><span class="cell-kind">${index + 1}. ${escapeHtml(cell.kindLabel)}</span><h3>${escapeHtml(cell.title)}</h3></div>`);
  if (cell.inputs.length) parts.push(tableHtml({ caption: 'Inputs', columns: ['Field', 'Value'], rows: cell.inputs }));
  // A note's Markdown reads as written (no HTML made from it); a pasted table keeps its columns.
  for (const t of cell.texts) parts.push(`<h4>${escapeHtml(t.label)}</h4><pre${cell.kind === 'note' ? ' class="note-text"' : ''}>${escapeHtml(t.text)}</pre>`);
  if (cell.status === 'notRun' && cell.kind !== 'note') parts.push('<p class="warnings">Not run when this version was saved: no results.</p>');
  if (cell.error) parts.push(`<p class="error">The engine refused this cell: ${escapeHtml(cell.error)}</p>`);
  for (const t of cell.tables) parts.push(tableHtml(t));
  if (cell.plots.length) parts.push(`<div class="plots">${cell.plots.map((p) => `<figure class="plot">${renderSvgPlot(p)}</figure>`).join('')}</div>`);
  if (cell.warnings.length) parts.push(`<div class="warnings"><strong>Warnings</strong><ul>${cell.warnings.map((w) => `<li>${escapeHtml(w)}</li>`).join('')}</ul></div>`);
  if (cell.methods.length) parts.push(`<p class="kicker">Methods: ${cell.methods.map((m) => `<a href="#method-${m}">${escapeHtml(methodNames.get(m) ?? m)}</a>`).join(', ')}</p>`);
  if (cell.outputKey) parts.push(`<p class="provenance">output key ${escapeHtml(cell.outputKey)} · engine ${escapeHtml(cell.engineVersion ?? '?')}${cell.computedAt ? ` · computed ${escapeHtml(when(cell.computedAt))}` : ''}</p>`);
  parts.push('</section>');
  return parts.join('');
}

export function renderReportHtml(model: VersionReportModel): string {
  const v = model.version;
  const methodNames = new Map(model.methods.map((m) => [m.id, m.name]));
  const title = `${model.study.title} — v${v.number} (${v.branchName})`;
  const verdicts = model.review.verdicts.length
    ? tableHtml({
        caption: 'Verdicts',
        columns: ['Reviewer', 'Verdict', 'When', 'Summary'],
        rows: model.review.verdicts.map((d) => [d.reviewer, d.current ? d.verdict : `${d.verdict} (superseded)`, when(d.createdAt), d.summary]),
      })
    : '<p>No verdict on this version.</p>';
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="Laminote engine ${escapeHtml(model.engineVersion)}">
<title>${escapeHtml(title)} · Laminote report</title>
<style>${reportStyle()}</style></head>
<body><main>
<p class="kicker">Laminote version report · ${escapeHtml(model.project)}</p>
<h1>${escapeHtml(title)}</h1>
<dl class="facts">
<dt>Study</dt><dd>${escapeHtml(model.study.title)}</dd>
<dt>Version</dt><dd>v${v.number} on branch ${escapeHtml(v.branchName)}${v.isBaseline ? ' · baseline' : ''}</dd>
<dt>Saved by</dt><dd>${escapeHtml(v.author)}, ${escapeHtml(when(v.createdAt))}</dd>
<dt>Message</dt><dd>${escapeHtml(v.message)}</dd>
<dt>Review</dt><dd data-review-state>${escapeHtml(model.review.state)}${model.review.earlier ? ` · ${escapeHtml(model.review.earlier)}` : ''}${model.review.pending.length ? ` · waiting for ${escapeHtml(model.review.pending.join(', '))}` : ''}</dd>
<dt>Engine</dt><dd>Laminote engine ${escapeHtml(model.engineVersion)} (each cell states the engine version and output key its results came from)</dd>
<dt>Made</dt><dd>${escapeHtml(when(model.generatedAt))} by ${escapeHtml(model.generatedBy)}</dd>
</dl>
<p class="caution" role="note"><strong>Caution.</strong> ${escapeHtml(model.caution)}</p>
<h2>Review</h2>
${verdicts}
<h2>Cells</h2>
${model.cells.map((c, i) => cellHtml(c, i, methodNames)).join('\n')}
<h2>Methods used</h2>
${model.methods
  .map(
    (m) =>
      `<div class="method" id="method-${m.id}"><h3>${escapeHtml(m.name)}</h3><p>${escapeHtml(m.purpose)}</p><p><em>Holds for:</em> ${escapeHtml(m.validity)}</p><p><em>Sources:</em> ${m.sources.map(escapeHtml).join(' ')}</p><p><em>Limits:</em> ${m.limits.map(escapeHtml).join(' ')}</p></div>`,
  )
  .join('')}
<footer>Made by Laminote from version ${escapeHtml(v.id)}. Invented demo data is labelled as such in its study. ${escapeHtml(model.caution)}</footer>
</main></body></html>`;
}
