import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { Study } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { Notifier } from '../core/notifier';
import { StudyApi } from '../shared/study-api';

/** Either a new study in a project, or an existing study to rename and describe. */
export type StudyDialogData = { readonly projectId: string; readonly study?: undefined } | { readonly study: Study };

/** Creates or renames a study; stays open with the server's message on the field at fault. */
@Component({
  selector: 'lam-study-dialog',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './study-dialog.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyDialog {
  private readonly api = inject(StudyApi);
  private readonly notifier = inject(Notifier);
  private readonly dialogRef = inject<MatDialogRef<StudyDialog, Study>>(MatDialogRef);
  protected readonly data = inject<StudyDialogData>(MAT_DIALOG_DATA);

  protected readonly form = inject(NonNullableFormBuilder).group({
    title: [this.data.study?.title ?? '', [Validators.required, Validators.maxLength(200)]],
    description: [this.data.study?.description ?? '', Validators.maxLength(4000)],
  });
  protected readonly saving = signal(false);

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const body = this.form.getRawValue();
    const request: Observable<Study> = this.data.study
      ? this.api.update(this.data.study.id, body)
      : this.api.create(this.data.projectId, body);
    this.saving.set(true);
    request.subscribe({
      next: (study) => this.dialogRef.close(study),
      error: (error: unknown) => {
        this.saving.set(false);
        this.notifier.formProblem(error, this.form.controls);
      },
    });
  }
}
