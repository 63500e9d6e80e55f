import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import type { SaveConflict, VersionSummary } from '@laminote/contracts';
import { toProblem } from '../core/problem';
import { Notifier } from '../core/notifier';
import { cellKindInfo } from '../shared/cell-kinds';
import type { DraftSession } from '../shared/draft-session';
import type { VersionRef } from './branch-dialog';
import { CellDiffList } from './cell-diff-list';
import { VersionApi } from './version-api';

export interface SaveVersionData {
  readonly studyId: string;
  readonly branchId: string;
  readonly branchName: string;
  /** The head the person sees now; null when the branch has no version yet. */
  readonly head: VersionRef | null;
  /** The notebook's draft session, when the dialog opens over the notebook: flushed before saving. */
  readonly session: DraftSession | null;
  /** Whether the person may send versions for review: then the dialog offers to, right after saving. */
  readonly mayRequestReview?: boolean;
}

/** The saved version, and whether the person asked to send it for review next. */
export interface SavedVersion {
  readonly version: VersionSummary;
  readonly sendForReview: boolean;
}

function isSaveConflict(body: unknown): body is SaveConflict {
  return typeof body === 'object' && body !== null && (body as SaveConflict).status === 409 && 'reason' in body;
}

/**
 * Saves the branch's draft as a version with a message. When someone saved first, the dialog stays
 * open with what their version changed, and the person decides: save on top of it, or look first.
 * The message typed is kept either way.
 */
@Component({
  selector: 'lam-save-version-dialog',
  imports: [CellDiffList, DatePipe, MatButtonModule, MatCheckboxModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule, RouterLink],
  templateUrl: './save-version-dialog.html',
  styleUrl: './save-version-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SaveVersionDialog {
  private readonly api = inject(VersionApi);
  private readonly notifier = inject(Notifier);
  private readonly dialogRef = inject<MatDialogRef<SaveVersionDialog, SavedVersion>>(MatDialogRef);
  protected readonly data = inject<SaveVersionData>(MAT_DIALOG_DATA);

  protected readonly form = inject(NonNullableFormBuilder).group({
    message: ['', [Validators.required, Validators.maxLength(2000)]],
    sendForReview: [false],
  });
  protected readonly saving = signal(false);
  /** The head the next save expects: the one shown, or the newer one after a conflict was seen. */
  private readonly expected = signal<string | null>(this.data.head?.id ?? null);
  protected readonly conflict = signal<SaveConflict | null>(null);
  protected readonly unsavedProblem = signal<string | null>(null);

  /** Cells whose result is missing or no longer matches their inputs: the version keeps them without one. */
  protected readonly withoutResult = computed(() =>
    (this.data.session?.cells() ?? []).filter((c) => cellKindInfo(c.kind).runs && c.runState !== 'current').map((c) => c.title.trim() || cellKindInfo(c.kind).label),
  );

  protected async submit(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.unsavedProblem.set(null);
    const session = this.data.session;
    if (session && !(await session.flush())) {
      this.saving.set(false);
      this.unsavedProblem.set('The draft has edits the server has not taken yet. Resolve the draft’s save problem first, then save the version.');
      return;
    }
    this.api
      .save(this.data.branchId, {
        message: this.form.getRawValue().message,
        expectedHeadVersionId: this.expected(),
        ...(session ? { draftRevision: session.revision() } : {}),
      })
      .subscribe({
        next: (version) => this.dialogRef.close({ version, sendForReview: this.form.getRawValue().sendForReview }),
        error: (error: unknown) => {
          this.saving.set(false);
          const body = (error as { error?: unknown }).error;
          if (isSaveConflict(body)) {
            this.conflict.set(body);
            if (body.reason === 'draftChanged') this.unsavedProblem.set(body.detail ?? 'The draft changed on the server.');
            return;
          }
          const problem = toProblem(error);
          if (problem.status === 409) this.unsavedProblem.set(problem.detail ?? problem.title);
          else this.notifier.formProblem(error, this.form.controls);
        },
      });
  }

  /** Having seen the other version, save this draft as the next version after it. */
  protected saveOnTop(): void {
    const head = this.conflict()?.currentHead;
    if (!head) return;
    this.expected.set(head.id);
    this.conflict.set(null);
    void this.submit();
  }
}
