import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { NavigationStart, Router, RouterLink } from '@angular/router';
import type { VersionSummary } from '@laminote/contracts';
import { filter } from 'rxjs';
import { Notifier } from '../core/notifier';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { VersionApi } from './version-api';
import { REVIEW_LABELS } from './version-labels';
import { EarlierVerdict } from '../review/earlier-verdict';

export interface HistoryDrawerData {
  readonly studyId: string;
  readonly branchId: string;
  /** Whether the draft is open here to take a restore (the notebook page, an editable branch). */
  readonly draftOpen: boolean;
}

/** What the person chose to do with a version; the version bar carries it out. */
export type HistoryChoice = { readonly action: 'restore' | 'branch'; readonly version: VersionSummary };

/**
 * The history of a branch (or of the whole study): every version with its number, message, author,
 * time and review state; open one read-only, compare it, restore it into the draft, branch from it,
 * mark it as the baseline.
 */
@Component({
  selector: 'lam-history-drawer',
  imports: [EarlierVerdict, DatePipe, MatButtonModule, MatButtonToggleModule, MatDialogModule, MatIconModule, MatMenuModule, MatProgressBarModule, MatTooltipModule, ProblemBanner, RouterLink],
  templateUrl: './history-drawer.html',
  styleUrl: './history-drawer.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HistoryDrawer {
  private readonly api = inject(VersionApi);
  private readonly notifier = inject(Notifier);
  private readonly dialogRef = inject<MatDialogRef<HistoryDrawer, HistoryChoice>>(MatDialogRef);
  protected readonly data = inject<HistoryDrawerData>(MAT_DIALOG_DATA);

  private readonly load = loader(() => this.data.studyId, (id) => this.api.history(id));
  protected readonly state = this.load.state;
  protected readonly scope = signal<'branch' | 'study'>('branch');

  private readonly permissions = computed(() => this.state().value?.permissions ?? null);
  protected readonly mayBranch = computed(() => this.permissions()?.branch ?? false);
  protected readonly mayMarkBaseline = computed(() => this.permissions()?.markBaseline ?? false);
  protected readonly mayRestore = computed(() => this.data.draftOpen && !this.branch()?.archived && (this.permissions()?.editStudy ?? false));
  protected readonly reviewLabels = REVIEW_LABELS;

  protected readonly branch = computed(() => this.state().value?.branches.find((b) => b.id === this.data.branchId) ?? null);
  protected readonly versions = computed(() => {
    const history = this.state().value;
    if (!history) return [];
    return this.scope() === 'branch' ? history.versions.filter((v) => v.branchId === this.data.branchId) : history.versions;
  });
  protected readonly baselineId = computed(() => this.state().value?.baselineVersionId ?? null);

  constructor() {
    // A link in the drawer (open, compare) leaves the page the drawer belongs to.
    inject(Router)
      .events.pipe(
        filter((e) => e instanceof NavigationStart),
        takeUntilDestroyed(),
      )
      .subscribe(() => this.dialogRef.close());
  }

  protected choose(action: HistoryChoice['action'], version: VersionSummary): void {
    this.dialogRef.close({ action, version });
  }

  protected markBaseline(version: VersionSummary | null): void {
    this.api.markBaseline(this.data.studyId, version?.id ?? null).subscribe({
      next: () => {
        this.notifier.done(version ? `Version ${version.number} of ${version.branchName} is now the study’s baseline.` : 'The study has no baseline now.');
        this.load.reload();
      },
      error: (error: unknown) => this.notifier.problem(error),
    });
  }

  protected retry(): void {
    this.load.reload();
  }
}
