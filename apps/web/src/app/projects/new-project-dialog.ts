import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { Project } from '@laminote/contracts';
import { Notifier } from '../core/notifier';
import { ProjectApi } from '../shared/project-api';

/** Site admins open a project and name its first lead. Closes with the new project. */
@Component({
  selector: 'lam-new-project-dialog',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './new-project-dialog.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewProjectDialog {
  private readonly api = inject(ProjectApi);
  private readonly notifier = inject(Notifier);
  private readonly dialogRef = inject<MatDialogRef<NewProjectDialog, Project>>(MatDialogRef);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(120)]],
    description: ['', Validators.maxLength(2000)],
    leadEmail: ['', [Validators.required, Validators.email]],
  });
  protected readonly saving = signal(false);

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.api.create(this.form.getRawValue()).subscribe({
      next: (project) => {
        this.notifier.done(`Project “${project.name}” created`);
        this.dialogRef.close(project);
      },
      error: (error: unknown) => {
        this.saving.set(false);
        this.notifier.formProblem(error, this.form.controls);
      },
    });
  }
}
