import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { DomSanitizer, type SafeHtml, Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { engineResultSchema, FIELD_LABELS, CELL_REFERENCE_FIELDS, TRANSITION_CRITERIA, orderedFields, valueLabel, type VersionCell } from '@laminote/contracts';
import { CRITERION_LABELS, analysisFigures, summarise } from '../shared/analysis-summary';
import { inactiveFields } from '../shared/active-inputs';
import { cellKindInfo } from '../shared/cell-kinds';
import { fixed, sci } from '../shared/format';
import { renderMarkdown } from '../shared/markdown';
import { loader } from '../shared/load-state';
import { NotFound } from '../shared/not-found';
import { Plot } from '../shared/plot';
import { ProblemBanner } from '../shared/problem-banner';
import { StudyApi } from '../shared/study-api';
import { projectNameOf } from '../shared/study-place';
import { CellThreads } from '../review/cell-threads';
import { CellThreadsButton } from '../review/cell-threads-button';
import { VersionReview } from '../review/version-review';
import { VersionApi } from './version-api';
import { REVIEW_LABELS } from './version-labels';

/** An input as the page shows it: labelled, numbers in engineering notation, cell references by title. */
function inputRows(cell: VersionCell, titles: Map<string, string>): { label: string; value: string }[] {
  const labels = FIELD_LABELS[cell.kind] ?? {};
  const shown = (key: string, value: unknown): string =>
    CELL_REFERENCE_FIELDS.has(key) && typeof value === 'string'
      ? (titles.get(value) ?? 'a cell not in this version')
      : typeof value === 'number'
        ? sci(value, 4)
        : typeof value === 'boolean'
          ? value
            ? 'yes'
            : 'no'
          : Array.isArray(value)
            ? value.map((v) => shown(key, v)).join(', ') || '—'
            : typeof value === 'object' && value !== null
              ? Object.entries(value as Record<string, unknown>).map(([k, v]) => `${k} ${shown(key, v)}`).join('; ') || '—'
              : valueLabel(key, String(value));
  // Only what the cell used: not the inputs its choices leave aside (the altitude of a flow given by Re).
  const unused = inactiveFields(cell.kind, cell.inputs);
  return orderedFields(cell.kind, Object.keys(cell.inputs))
    .filter(
      (key) =>
        !unused.has(key) &&
        !(cell.kind === 'pressure' && key === 'text') &&
        !(cell.kind === 'note' && key === 'markdown') &&
        cell.inputs[key] !== null &&
        cell.inputs[key] !== undefined,
    )
    .map((key) => ({ label: labels[key] ?? key, value: shown(key, cell.inputs[key]) }));
}

/**
 * One saved version, read-only: who saved it, when and why, and its cells as they were, with the
 * results stored with them. Versions never change; a version can be compared or branched from.
 */
@Component({
  selector: 'lam-version-page',
  imports: [CellThreads, CellThreadsButton, DatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, MatTooltipModule, NotFound, Plot, ProblemBanner, RouterLink, VersionReview],
  templateUrl: './version-page.html',
  styleUrl: './version-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VersionPage {
  private readonly api = inject(VersionApi);
  private readonly title = inject(Title);
  private readonly sanitizer = inject(DomSanitizer);

  /** From the route. */
  readonly studyId = input.required<string>();
  readonly versionId = input.required<string>();

  private readonly load = loader(this.versionId, (id) => this.api.version(id));
  private readonly studies = inject(StudyApi);
  private readonly studyLoad = loader(this.studyId, (id) => this.studies.get(id));
  protected readonly study = computed(() => this.studyLoad.state().value ?? null);
  protected readonly projectName = projectNameOf(() => this.study()?.projectId ?? null);
  protected readonly state = this.load.state;
  protected readonly notFound = computed(() => this.state().problem?.status === 404);
  protected readonly reviewLabels = REVIEW_LABELS;
  protected readonly criterionLabels = CRITERION_LABELS;

  protected readonly cells = computed(() => {
    const version = this.state().value;
    if (!version) return [];
    const titles = new Map(version.cells.map((c) => [c.cellId, c.title.trim() || cellKindInfo(c.kind).label]));
    return version.cells.map((cell) => {
      const info = cellKindInfo(cell.kind);
      const parsed = cell.kind === 'analysis' && cell.output?.status === 'ok' ? engineResultSchema.safeParse(cell.output.result) : null;
      const result = parsed?.success ? parsed.data : null;
      const criteria = TRANSITION_CRITERIA.filter((c) => result?.surfaces.some((s) => s.transition.criteria[c] !== undefined));
      const markdown = cell.kind === 'note' && typeof cell.inputs['markdown'] === 'string' ? cell.inputs['markdown'] : null;
      const text = cell.kind === 'pressure' && typeof cell.inputs['text'] === 'string' ? cell.inputs['text'] : null;
      return {
        cell,
        icon: info.icon,
        kindLabel: info.label,
        title: titles.get(cell.cellId)!,
        inputs: inputRows(cell, titles),
        // DOMPurify has already removed everything unsafe (renderMarkdown); Angular's pass would strip styling only.
        note: markdown === null ? null : (this.sanitizer.bypassSecurityTrustHtml(renderMarkdown(markdown)) as SafeHtml),
        table: text === null ? null : { text: text.length > 20_000 ? `${text.slice(0, 20_000)}\n…` : text, lines: text.split('\n').length },
        runs: info.runs,
        output: cell.output,
        result,
        criteria,
        summary: result ? summarise(result, criteria) : [],
        figures: result ? analysisFigures(result).filter((f) => f.id === 'n' || f.id === 'h') : [],
      };
    });
  });

  protected readonly fixed = fixed;
  protected reportUrl(versionId: string, format: 'html' | 'pdf', download = false): string {
    return this.api.reportUrl(versionId, format, download);
  }

  protected studyExportUrl(versionId: string): string {
    return this.api.studyExportUrl(versionId);
  }
  protected readonly sci = sci;

  constructor() {
    effect(() => {
      const v = this.state().value;
      if (v) this.title.setTitle(`${v.branchName} v${v.number} · Laminote`);
    });
  }

  protected retry(): void {
    this.load.reload();
  }
}
