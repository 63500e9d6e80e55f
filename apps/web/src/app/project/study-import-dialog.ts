import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { ImportStudyResult, StudyDocument } from '@laminote/contracts';
import { applyProblemToControls, problemMessage, toProblem } from '../core/problem';
import { StudyApi } from '../shared/study-api';

export interface StudyImportDialogData {
  readonly projectId: string;
  readonly fileName: string;
  readonly document: StudyDocument;
}

/** How the dialog ended: the study made, or why the server would not make it (not about the title). */
export type StudyImportOutcome = { readonly made: ImportStudyResult } | { readonly problem: string };

/**
 * "Import a study", once the chosen file has read as a study export: says what is in it and lets the
 * person name the new study (the export's own title to begin with) before anything is made. A problem
 * with the title stays on the field; any other closes the dialog with the server's words.
 */
@Component({
  selector: 'lam-study-import-dialog',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './study-import-dialog.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyImportDialog {
  private readonly api = inject(StudyApi);
  private readonly dialogRef = inject<MatDialogRef<StudyImportDialog, StudyImportOutcome>>(MatDialogRef);
  protected readonly data = inject<StudyImportDialogData>(MAT_DIALOG_DATA);

  protected readonly form = inject(NonNullableFormBuilder).group({
    title: [this.data.document.study.title, [Validators.required, Validators.maxLength(200)]],
  });
  protected readonly saving = signal(false);

  /** Where the cells come from, in a line: the study, the draft or version, and the day it was exported. */
  protected readonly source = (() => {
    const d = this.data.document;
    const from = d.source.kind === 'version' ? `version ${d.source.versionNumber ?? '?'}${d.source.branchName ? ` on ${d.source.branchName}` : ''}` : `the draft${d.source.branchName ? ` of ${d.source.branchName}` : ''}`;
    return `${d.cells.length} ${d.cells.length === 1 ? 'cell' : 'cells'} from ${from} of “${d.study.title}”, exported ${d.exportedAt.slice(0, 10)}`;
  })();

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.api.importStudy(this.data.projectId, { document: this.data.document, title: this.form.getRawValue().title }).subscribe({
      next: (made) => this.dialogRef.close({ made }),
      error: (error: unknown) => {
        this.saving.set(false);
        const problem = toProblem(error);
        const unplaced = applyProblemToControls(problem, this.form.controls);
        if (unplaced.length > 0) this.dialogRef.close({ problem: problemMessage(problem) });
      },
    });
  }
}
