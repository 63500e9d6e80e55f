import { Clipboard } from '@angular/cdk/clipboard';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatTabsModule } from '@angular/material/tabs';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import type { Comparison } from '@laminote/contracts';
import { of } from 'rxjs';
import { Notifier } from '../core/notifier';
import { sci } from '../shared/format';
import { loader } from '../shared/load-state';
import { NotFound } from '../shared/not-found';
import { Plot } from '../shared/plot';
import { ProblemBanner } from '../shared/problem-banner';
import { StudyApi } from '../shared/study-api';
import { projectNameOf } from '../shared/study-place';
import { CellDiffList } from './cell-diff-list';
import { flowChanges, overlayFigures, sameResults, surfaceTable, sweepFigure, sweepRows, versionLabel } from './compare-view';
import { VersionApi } from './version-api';
import { type VersionGroup, VersionPicker } from './version-picker';

/**
 * Two versions of a study side by side, at an address of its own (`/studies/:id/compare?a=…&b=…`) so it
 * can be sent to a colleague: the flow each analysis ran at, a table of deltas in transition, laminar
 * extent and drag with what each means for the design, overlaid Cp, N-factor and H, and the cells that
 * differ with their changed inputs.
 */
@Component({
  selector: 'lam-compare-page',
  imports: [
    CellDiffList,
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatSlideToggleModule,
    MatTabsModule,
    MatTooltipModule,
    NotFound,
    Plot,
    ProblemBanner,
    RouterLink,
    VersionPicker,
  ],
  templateUrl: './compare-page.html',
  styleUrl: './compare-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ComparePage {
  private readonly api = inject(VersionApi);
  private readonly studies = inject(StudyApi);
  private readonly router = inject(Router);
  private readonly clipboard = inject(Clipboard);
  private readonly notifier = inject(Notifier);
  private readonly title = inject(Title);

  /** From the route. */
  readonly studyId = input.required<string>();
  /** From the query: the version before (A) and after (B). */
  readonly a = input<string | undefined>(undefined);
  readonly b = input<string | undefined>(undefined);

  private readonly studyLoad = loader(this.studyId, (id) => this.studies.get(id));
  private readonly historyLoad = loader(this.studyId, (id) => this.api.history(id));
  private readonly compareLoad = loader(
    () => ({ a: this.a(), b: this.b() }),
    ({ a, b }) => (a && b ? this.api.compare(a, b) : of(null)),
  );
  protected readonly study = computed(() => this.studyLoad.state().value ?? null);
  protected readonly projectName = projectNameOf(() => this.study()?.projectId ?? null);
  protected readonly history = computed(() => this.historyLoad.state().value ?? null);
  protected readonly state = this.compareLoad.state;
  protected readonly comparison = computed((): Comparison | null => this.state().value ?? null);
  protected readonly notFound = computed(() => this.studyLoad.state().problem?.status === 404);
  protected readonly showUnchanged = signal(false);

  /** The study's versions for the pickers, grouped by branch, newest first. */
  protected readonly groups = computed((): VersionGroup[] => {
    const history = this.history();
    if (!history) return [];
    return history.branches
      .map((branch) => ({ branch, versions: history.versions.filter((v) => v.branchId === branch.id).sort((x, y) => y.number - x.number) }))
      .filter((g) => g.versions.length > 0);
  });

  protected readonly results = computed(() => {
    const c = this.comparison();
    if (!c) return [];
    return c.results.map((r) => ({
      result: r,
      same: sameResults(r),
      flow: flowChanges(r, (v) => sci(v, 3)),
      surfaces: r.surfaces.map((s) => ({ name: s.name, table: surfaceTable(s), figures: overlayFigures(r, s, c.a, c.b) })),
    }));
  });
  /** Each sweep's steps in A and B, compared by result (an upstream change moves them too). */
  protected readonly sweeps = computed(() => {
    const c = this.comparison();
    if (!c) return [];
    return (c.sweeps ?? []).map((s) => ({ sweep: s, rows: sweepRows(s), figure: sweepFigure(s, c.a, c.b) }));
  });
  protected readonly label = versionLabel;
  protected readonly baselineId = computed(() => this.history()?.baselineVersionId ?? null);

  constructor() {
    // Only B given (the version bar's "Compare"): A is the version before it, written into the address
    // so the link names both.
    effect(() => {
      const b = this.b();
      if (this.a() || !b) return;
      const parent = this.history()?.versions.find((v) => v.id === b)?.parentVersionId;
      if (parent) void this.router.navigate([], { queryParams: { a: parent }, queryParamsHandling: 'merge', replaceUrl: true });
    });
    effect(() => {
      const c = this.comparison();
      const study = this.study();
      if (c && study) this.title.setTitle(`${versionLabel(c.a)} vs ${versionLabel(c.b)} · ${study.title} · Laminote`);
    });
  }

  protected pick(side: 'a' | 'b', versionId: string): void {
    void this.router.navigate([], { queryParams: { [side]: versionId }, queryParamsHandling: 'merge' });
  }

  protected swap(): void {
    void this.router.navigate([], { queryParams: { a: this.b(), b: this.a() } });
  }

  /** The comparison as a report to keep or send (HTML or PDF from the server, plots drawn in it). */
  protected reportUrl(a: string, b: string, format: 'html' | 'pdf', download = false): string {
    return this.api.compareReportUrl(a, b, format, download);
  }

  protected copyLink(): void {
    const url = new URL(this.router.serializeUrl(this.router.createUrlTree(['/studies', this.studyId(), 'compare'], { queryParams: { a: this.a(), b: this.b() } })), window.location.origin);
    this.notifier.done(this.clipboard.copy(url.href) ? 'Link to this comparison copied.' : `Copy this link: ${url.href}`);
  }

  protected retry(): void {
    this.compareLoad.reload();
  }

}
