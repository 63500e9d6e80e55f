import { createRequire } from 'node:module';
import path from 'node:path';
import pdfmake from 'pdfmake';
import type { Content, TDocumentDefinitions, TableCell } from 'pdfmake/interfaces';
import type { ReportCell, ReportTable } from './cell-sections';
import { when } from './format';
import type { CompareReportModel, CompareSection } from './compare-model';
import type { VersionReportModel } from './model';
import { PLOT_HEIGHT, PLOT_WIDTH, renderSvgPlot } from './svg-plot';

/**
 * The version report as PDF, made in the server process by pdfmake (on pdfkit): pure JavaScript, no
 * browser or binary, no network. It reads the same model as the HTML report, so both hold the same
 * cells, tables, plots (the same SVG, drawn as vectors), warnings, verdicts and provenance. DejaVu
 * (from npm) is embedded as the one face: it carries Greek and the mathematical signs the tables use.
 */
const require = createRequire(import.meta.url);
const FONT_DIR = path.dirname(require.resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf'));
const font = (file: string) => path.join(FONT_DIR, file);

pdfmake.setFonts({
  'DejaVu Sans': { normal: font('DejaVuSans.ttf'), bold: font('DejaVuSans-Bold.ttf'), italics: font('DejaVuSans-Oblique.ttf'), bolditalics: font('DejaVuSans-BoldOblique.ttf') },
  'DejaVu Sans Mono': { normal: font('DejaVuSansMono.ttf'), bold: font('DejaVuSansMono-Bold.ttf'), italics: font('DejaVuSansMono-Oblique.ttf'), bolditalics: font('DejaVuSansMono-BoldOblique.ttf') },
});
// Nothing is fetched: no URL is allowed, and only the embedded fonts may be read from disk.
pdfmake.setUrlAccessPolicy(() => false);
pdfmake.setLocalAccessPolicy((file: string) => path.resolve(file).startsWith(FONT_DIR + path.sep));

const BLUE = '#1f5f8b';
const MAX_TEXT_LINES = 400;

function table(t: ReportTable): Content {
  const numeric = new Set(t.numeric ?? []);
  const header: TableCell[] = t.columns.map((c) => ({ text: c, style: 'th' }));
  const body: TableCell[][] = [header, ...t.rows.map((r) => r.map((v, i): TableCell => (numeric.has(i) ? { text: v, style: 'num' } : { text: v })))];
  return {
    stack: [
      ...(t.caption ? [{ text: t.caption, style: 'caption' } as Content] : []),
      { table: { headerRows: 1, widths: t.columns.map((_, i) => (i === t.columns.length - 1 ? '*' : 'auto')), body }, layout: 'lightHorizontalLines', margin: [0, 2, 0, 8] },
    ],
  };
}

function cellContent(cell: ReportCell, index: number, methodNames: ReadonlyMap<string, string>): Content[] {
  const out: Content[] = [
    { text: `${index + 1}. ${cell.kindLabel.toUpperCase()}`, style: 'kind', margin: [0, 14, 0, 0] },
    { text: cell.title, style: 'h3' },
  ];
  if (cell.inputs.length) out.push(table({ caption: 'Inputs', columns: ['Field', 'Value'], rows: cell.inputs }));
  for (const t of cell.texts) {
    const lines = t.text.split('\n');
    const shown = lines.length > MAX_TEXT_LINES ? [...lines.slice(0, MAX_TEXT_LINES), `… ${lines.length - MAX_TEXT_LINES} more lines in the HTML report`] : lines;
    out.push({ text: t.label, style: 'caption' }, cell.kind === 'note' ? { text: shown.join('\n'), margin: [0, 0, 0, 6] } : { text: shown.join('\n'), style: 'pre' });
  }
  if (cell.status === 'notRun' && cell.kind !== 'note') out.push({ text: 'Not run when this version was saved: no results.', style: 'warning' });
  if (cell.error) out.push({ text: `The engine refused this cell: ${cell.error}`, style: 'error' });
  for (const t of cell.tables) out.push(table(t));
  for (const p of cell.plots) out.push(plotContent(p));
  if (cell.warnings.length) out.push({ stack: [{ text: 'Warnings', bold: true }, { ul: cell.warnings }], style: 'warning' });
  if (cell.methods.length) out.push({ text: `Methods: ${cell.methods.map((m) => methodNames.get(m) ?? m).join(', ')}`, style: 'small' });
  if (cell.outputKey) out.push({ text: `output key ${cell.outputKey} · engine ${cell.engineVersion ?? '?'}${cell.computedAt ? ` · computed ${when(cell.computedAt)}` : ''}`, style: 'provenance' });
  return out;
}

export function reportDocument(model: VersionReportModel): TDocumentDefinitions {
  const v = model.version;
  const methodNames = new Map(model.methods.map((m) => [m.id, m.name]));
  const facts: [string, string][] = [
    ['Study', model.study.title],
    ['Version', `v${v.number} on branch ${v.branchName}${v.isBaseline ? ' · baseline' : ''}`],
    ['Saved by', `${v.author}, ${when(v.createdAt)}`],
    ['Message', v.message],
    ['Review', [model.review.state, model.review.earlier, model.review.pending.length ? `waiting for ${model.review.pending.join(', ')}` : null].filter(Boolean).join(' · ')],
    ['Engine', `Laminote engine ${model.engineVersion} (each cell states the engine version and output key of its results)`],
    ['Made', `${when(model.generatedAt)} by ${model.generatedBy}`],
  ];
  const content: Content[] = [
    { text: `Laminote version report · ${model.project}`, style: 'small' },
    { text: `${model.study.title} — v${v.number} (${v.branchName})`, style: 'h1' },
    { table: { widths: ['auto', '*'], body: facts.map(([k, val]) => [{ text: k, color: '#44474e' }, val]) }, layout: 'noBorders', margin: [0, 4, 0, 8] },
    { text: [{ text: 'Caution. ', bold: true }, model.caution], style: 'caution' },
    { text: 'Review', style: 'h2' },
    model.review.verdicts.length
      ? table({ caption: 'Verdicts', columns: ['Reviewer', 'Verdict', 'When', 'Summary'], rows: model.review.verdicts.map((d) => [d.reviewer, d.current ? d.verdict : `${d.verdict} (superseded)`, when(d.createdAt), d.summary]) })
      : { text: 'No verdict on this version.' },
    { text: 'Cells', style: 'h2' },
    ...model.cells.flatMap((c, i) => cellContent(c, i, methodNames)),
    { text: 'Methods used', style: 'h2', pageBreak: 'before' },
    ...model.methods.flatMap((m): Content[] => [
      { text: m.name, style: 'h3' },
      { text: m.purpose },
      { text: [{ text: 'Holds for: ', italics: true }, m.validity] },
      { text: [{ text: 'Sources: ', italics: true }, m.sources.join(' ')] },
      { text: [{ text: 'Limits: ', italics: true }, m.limits.join(' ')], margin: [0, 0, 0, 8] },
    ]),
  ];
  return framed(
    { title: `${model.study.title} v${v.number} (${v.branchName})`, author: v.author, subject: 'Laminote version report', creator: `Laminote engine ${model.engineVersion}`, producer: 'Laminote (pdfmake)' },
    `${model.study.title} v${v.number} · Laminote engine ${model.engineVersion} · engineering estimates, see the caution`,
    content,
  );
}

const STYLES: TDocumentDefinitions['styles'] = {
  h1: { fontSize: 17, bold: true, margin: [0, 2, 0, 4] },
  h2: { fontSize: 13, bold: true, color: BLUE, margin: [0, 14, 0, 4] },
  h3: { fontSize: 11, bold: true, margin: [0, 2, 0, 4] },
  kind: { fontSize: 7.5, bold: true, color: BLUE },
  th: { bold: true, fillColor: '#f1f2f6' },
  num: { font: 'DejaVu Sans Mono', fontSize: 8, alignment: 'right' },
  caption: { bold: true, margin: [0, 4, 0, 2] },
  pre: { font: 'DejaVu Sans Mono', fontSize: 6.5, background: '#f6f7f9', margin: [0, 0, 0, 6] },
  warning: { fillColor: '#fff7e0', color: '#5c4a00', margin: [0, 4, 0, 4] },
  error: { color: '#b3261e', margin: [0, 4, 0, 4] },
  caution: { color: '#7a2e10', margin: [0, 6, 0, 6] },
  small: { fontSize: 8, color: '#44474e' },
  provenance: { font: 'DejaVu Sans Mono', fontSize: 6.5, color: '#5d5f66', margin: [0, 2, 0, 0] },
};

/** Every report's page: A4, the one face, the house styles, and a footer with its line and page count. */
function framed(info: TDocumentDefinitions['info'], footerLine: string, content: Content[]): TDocumentDefinitions {
  return {
    pageSize: 'A4',
    pageMargins: [40, 48, 40, 48],
    info,
    defaultStyle: { font: 'DejaVu Sans', fontSize: 9, lineHeight: 1.2 },
    styles: STYLES,
    footer: (page: number, pages: number) => ({
      columns: [
        { text: footerLine, fontSize: 7, color: '#5d5f66' },
        { text: `page ${page} of ${pages}`, alignment: 'right', fontSize: 7, color: '#5d5f66' },
      ],
      margin: [40, 16, 40, 0],
    }),
    content,
  };
}

const plotContent = (p: Parameters<typeof renderSvgPlot>[0]): Content => ({ svg: renderSvgPlot(p), width: 480, height: (480 * PLOT_HEIGHT) / PLOT_WIDTH, margin: [0, 4, 0, 6] }) as Content;

function compareSection(section: CompareSection): Content[] {
  return [
    { text: section.kindLabel.toUpperCase(), style: 'kind', margin: [0, 14, 0, 0] },
    { text: section.title, style: 'h3' },
    ...(section.note ? [{ text: section.note, style: 'warning' } as Content] : []),
    table(section.table),
    ...section.plots.map(plotContent),
    ...(section.warnings.length ? [{ stack: [{ text: 'Warnings', bold: true }, { ul: section.warnings }], style: 'warning' } as Content] : []),
  ];
}

/** The comparison of two versions as PDF: the same model, hence the same content, as its HTML report. */
export function compareDocument(m: CompareReportModel): TDocumentDefinitions {
  const facts: [string, string][] = [['Study', m.studyTitle], ...m.sides.map((s): [string, string] => [s.label, s.text]), ['Cells', m.cellCounts], ['Made', `${when(m.generatedAt)} by ${m.generatedBy} · Laminote engine ${m.engineVersion}`]];
  const content: Content[] = [
    { text: `Laminote comparison report · ${m.project}`, style: 'small' },
    { text: m.title, style: 'h1' },
    { table: { widths: ['auto', '*'], body: facts.map(([k, val]) => [{ text: k, color: '#44474e' }, val]) }, layout: 'noBorders', margin: [0, 4, 0, 8] },
    { text: [{ text: 'Caution. ', bold: true }, m.caution], style: 'caution' },
    { text: 'What changed', style: 'h2' },
    m.changes ? table(m.changes) : { text: 'The two versions hold the same cells with the same inputs and results.' },
    { text: 'Transition and drag, A against B', style: 'h2' },
    ...(m.results.length ? m.results.flatMap(compareSection) : [{ text: 'Neither version has a transition analysis to compare.' } as Content]),
    ...(m.sweeps.length ? [{ text: 'Parameter sweeps', style: 'h2' } as Content, ...m.sweeps.flatMap(compareSection)] : []),
    { text: `Made by Laminote from versions ${m.sides[0].id} (A) and ${m.sides[1].id} (B); each version's own report holds every cell in full. Invented demo data is labelled as such in its study.`, style: 'small', margin: [0, 16, 0, 0] },
  ];
  return framed(
    { title: m.title, subject: 'Laminote comparison report', creator: `Laminote engine ${m.engineVersion}`, producer: 'Laminote (pdfmake)' },
    `${m.studyTitle}: comparison · Laminote engine ${m.engineVersion} · engineering estimates, see the caution`,
    content,
  );
}

/** What a PDF is made of: a version report or a comparison. */
export type PdfJob = { kind: 'version'; model: VersionReportModel } | { kind: 'compare'; model: CompareReportModel };

export async function renderPdf(job: PdfJob): Promise<Buffer> {
  return pdfmake.createPdf(job.kind === 'version' ? reportDocument(job.model) : compareDocument(job.model)).getBuffer();
}
