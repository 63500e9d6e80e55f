import { ChangeDetectionStrategy, Component, Injector, computed, inject, input, linkedSignal, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { ComponentType } from '@angular/cdk/portal';
import type { MatDialogConfig, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import type { Branch, BranchOverview, ProjectAccess, VersionSummary } from '@laminote/contracts';
import { can } from '@laminote/contracts/access';
import { firstValueFrom } from 'rxjs';
import { Notifier } from '../core/notifier';
import type { ConfirmDialog, ConfirmDialogData } from '../shared/confirm-dialog';
import { NotebookApi } from '../shared/notebook-api';
import { DraftSession } from '../shared/draft-session';
import { DIALOG_NOT_LOADED, openLazyDialog } from '../shared/lazy-dialog';
import type { BranchDialog, BranchDialogData, VersionRef } from './branch-dialog';
import type { HistoryChoice, HistoryDrawer, HistoryDrawerData } from './history-drawer';
import type { SaveVersionData, SaveVersionDialog, SavedVersion } from './save-version-dialog';
import { VersionApi } from './version-api';
import { StudyReviewState } from '../review/study-review-state';
import type { SendForReviewData, SendForReviewDialog } from '../review/send-for-review-dialog';

/**
 * The notebook header's version bar: which branch this is (and a switch to the others), its head
 * version, "Save version", the history, a new branch from the head, and a compare of the head with
 * what came before it. It works from what the notebook page already loaded (the study's branches, the
 * person's access) and asks the server only when the person acts. What a role does not allow is not
 * offered; the server refuses it anyway.
 */
@Component({
  selector: 'lam-version-bar',
  imports: [StudyReviewState, MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule, MatTooltipModule, RouterLink],
  templateUrl: './version-bar.html',
  styleUrl: './version-bar.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VersionBar {
  private readonly api = inject(VersionApi);
  private readonly notebook = inject(NotebookApi);
  private readonly injector = inject(Injector);
  private dialogOnItsWay = false;
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  /** Present over the notebook page: flushed before saving, reopened after a restore. */
  private readonly session = inject(DraftSession, { optional: true });

  readonly studyId = input.required<string>();
  readonly branchId = input.required<string>();
  /** The study's branches as the notebook page loaded them. */
  readonly branches = input.required<readonly Branch[]>();
  /** The person's access in the study's project (null while unknown). */
  readonly access = input.required<ProjectAccess | null>();
  /** An archived study is read-only: no saving, restoring or branching. */
  readonly studyArchived = input(false);

  /** The branch heads, moved here by saves made from this bar until the page loads the branches again. */
  private readonly heads = linkedSignal(() => new Map(this.branches().map((b) => [b.id, b.headVersionId ? { id: b.headVersionId, number: b.headNumber ?? null } : null])));

  protected readonly activeBranches = computed(() => this.branches().filter((b) => !b.archived || b.id === this.branchId()));
  protected readonly archivedBranches = computed(() => this.branches().filter((b) => b.archived && b.id !== this.branchId()));
  protected readonly branch = computed(() => this.branches().find((b) => b.id === this.branchId()) ?? null);
  protected readonly head = computed(() => this.heads().get(this.branchId()) ?? null);
  protected readonly headNumberOf = (b: Branch) => this.heads().get(b.id)?.number ?? null;

  private readonly writable = computed(() => !this.studyArchived() && !this.branch()?.archived);
  private may(action: 'saveVersion' | 'branch' | 'requestReview'): boolean {
    const access = this.access();
    return access !== null && can(access, action);
  }
  protected readonly maySave = computed(() => this.writable() && this.may('saveVersion'));
  protected readonly mayBranch = computed(() => !this.studyArchived() && this.may('branch'));
  protected readonly mayRequestReview = computed(() => this.may('requestReview'));
  /** Counts the reviews sent from here, so the head's review state is asked again. */
  protected readonly reviewsSent = signal(0);

  private headRef(): VersionRef | null {
    const head = this.head();
    const branch = this.branch();
    return head && branch && head.number !== null ? { id: head.id, number: head.number, branchName: branch.name } : null;
  }

  protected async switchTo(branchId: string): Promise<void> {
    if (branchId === this.branchId()) return;
    await this.session?.flush();
    await this.router.navigate(['/studies', this.studyId()], { queryParams: { branch: branchId } });
  }

  protected saveVersion(): void {
    const branch = this.branch();
    if (!branch) return;
    const data: SaveVersionData = {
      studyId: this.studyId(),
      branchId: branch.id,
      branchName: branch.name,
      head: this.headRef(),
      session: this.session,
      mayRequestReview: this.mayRequestReview(),
    };
    void this.openDialog<SaveVersionDialog, SaveVersionData, SavedVersion>(() => import('./save-version-dialog').then((m) => m.SaveVersionDialog), {
      data,
      width: '44rem',
      maxWidth: '94vw',
    }).then((ref) =>
      ref?.afterClosed().subscribe((saved) => {
        if (!saved) return;
        const { version } = saved;
        this.heads.update((heads) => new Map(heads).set(version.branchId, { id: version.id, number: version.number }));
        this.notifier.done(`Saved version ${version.number} of ${version.branchName}.`);
        if (saved.sendForReview) this.sendForReview({ id: version.id, number: version.number, branchName: version.branchName });
      }),
    );
  }

  protected sendHeadForReview(): void {
    const head = this.headRef();
    if (head) this.sendForReview(head);
  }

  private sendForReview(version: VersionRef): void {
    const data: SendForReviewData = { studyId: this.studyId(), versionId: version.id, versionNumber: version.number, branchName: version.branchName };
    void this.openDialog<SendForReviewDialog, SendForReviewData, unknown>(() => import('../review/send-for-review-dialog').then((m) => m.SendForReviewDialog), {
      data,
      width: '34rem',
      maxWidth: '94vw',
    }).then((ref) =>
      ref?.afterClosed().subscribe((review) => {
        if (review) this.reviewsSent.update((n) => n + 1);
      }),
    );
  }

  protected openHistory(): void {
    const data: HistoryDrawerData = { studyId: this.studyId(), branchId: this.branchId(), draftOpen: this.session !== null && this.writable() };
    void this.openDialog<HistoryDrawer, HistoryDrawerData, HistoryChoice>(() => import('./history-drawer').then((m) => m.HistoryDrawer), {
      data,
      position: { right: '0', top: '0' },
      height: '100vh',
      width: '30rem',
      maxWidth: '100vw',
      panelClass: 'lam-history-drawer',
      autoFocus: 'dialog',
    }).then((ref) =>
      ref?.afterClosed().subscribe((choice) => {
        if (choice?.action === 'branch') this.branchFrom(choice.version);
        if (choice?.action === 'restore') void this.restore(choice.version);
      }),
    );
  }

  protected branchFromHead(): void {
    const head = this.headRef();
    if (head) this.branchFrom(head);
  }

  private branchFrom(version: VersionRef): void {
    void this.openDialog<BranchDialog, BranchDialogData, BranchOverview>(() => import('./branch-dialog').then((m) => m.BranchDialog), {
      data: { version },
      width: '32rem',
      maxWidth: '94vw',
    }).then((ref) =>
      ref?.afterClosed().subscribe(async (branch) => {
        if (!branch) return;
        this.notifier.done(`Branch “${branch.name}” starts from version ${version.number} of ${version.branchName}.`);
        await this.session?.flush();
        await this.router.navigate(['/studies', this.studyId()], { queryParams: { branch: branch.id } });
      }),
    );
  }

  /** Replaces the draft's cells by a version's, as one draft change; the person confirms first. */
  private async restore(version: VersionSummary): Promise<void> {
    const session = this.session;
    if (!session) return;
    const confirm = await this.openDialog<ConfirmDialog, ConfirmDialogData, boolean>(() => import('../shared/confirm-dialog').then((m) => m.ConfirmDialog), {
      data: {
        title: `Restore version ${version.number}?`,
        message: `The draft’s cells become those of version ${version.number} (“${version.message}”). Cells it does not have go to Recently removed. The restore is a draft change: save a version afterwards to keep it.`,
        confirmLabel: 'Restore into the draft',
      },
    });
    if (!confirm) return;
    const confirmed = await firstValueFrom(confirm.afterClosed());
    if (!confirmed) return;
    if (!(await session.flush())) {
      this.notifier.problem({ type: 'about:blank', status: 409, title: 'The draft has unsaved edits', detail: 'Resolve the draft’s save problem first, then restore.' });
      return;
    }
    const branchId = this.branchId();
    this.api.restore(branchId, { versionId: version.id, baseRevision: session.revision() }).subscribe({
      next: (result) => {
        this.notebook.draft(branchId).subscribe((draft) => session.open(branchId, draft));
        const trashed = result.movedToTrash.length;
        this.notifier.done(`The draft is now version ${version.number}${trashed ? `; ${trashed} cell${trashed === 1 ? '' : 's'} moved to Recently removed` : ''}.`);
      },
      error: (error: unknown) => this.notifier.problem(error),
    });
  }

  /**
   * Opens a dialog whose code is fetched the first time it is asked for (`openLazyDialog`): the
   * notebook's first screen does without the version dialogs. When the code cannot be fetched, the
   * person is told and null is returned.
   */
  private async openDialog<C, D, R>(load: () => Promise<ComponentType<C>>, config: MatDialogConfig<D>): Promise<MatDialogRef<C, R> | null> {
    // A second click while the first dialog's code is on its way opens nothing more (an open dialog
    // covers the bar itself).
    if (this.dialogOnItsWay) return null;
    this.dialogOnItsWay = true;
    try {
      return await openLazyDialog<C, D, R>(this.injector, load, config);
    } catch {
      this.notifier.problem(DIALOG_NOT_LOADED);
      return null;
    } finally {
      this.dialogOnItsWay = false;
    }
  }
}
