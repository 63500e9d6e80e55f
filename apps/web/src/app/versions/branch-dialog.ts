import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { BranchOverview } from '@laminote/contracts';
import { Notifier } from '../core/notifier';
import { VersionApi } from './version-api';

/** A version as the dialogs name it. */
export interface VersionRef {
  readonly id: string;
  readonly number: number;
  readonly branchName: string;
  readonly message?: string;
}

export interface BranchDialogData {
  /** The version the new branch starts from. */
  readonly version: VersionRef;
}

/** Starts a design variant from a version: a branch whose draft is that version's cells. */
@Component({
  selector: 'lam-branch-dialog',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title>New branch from version {{ data.version.number }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="lam-dialog-form">
        <p class="from">Its draft starts as {{ origin }}; its own versions are numbered from 1.</p>
        <mat-form-field>
          <mat-label>Branch name</mat-label>
          <input matInput formControlName="name" required maxlength="80" autocomplete="off" />
          @if (form.controls.name.hasError('server')) {
            <mat-error>{{ form.controls.name.getError('server') }}</mat-error>
          } @else if (form.controls.name.hasError('required')) {
            <mat-error>Give the branch a name</mat-error>
          }
        </mat-form-field>
        <mat-form-field>
          <mat-label>Purpose</mat-label>
          <textarea matInput formControlName="purpose" rows="3" maxlength="2000" placeholder="e.g. Thinner leading edge to delay the pressure peak"></textarea>
          @if (form.controls.purpose.hasError('server')) {
            <mat-error>{{ form.controls.purpose.getError('server') }}</mat-error>
          }
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving()">Create branch</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .from {
      margin: 0 0 0.75rem;
      color: var(--mat-sys-on-surface-variant);
    }
    mat-form-field {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BranchDialog {
  private readonly api = inject(VersionApi);
  private readonly notifier = inject(Notifier);
  private readonly dialogRef = inject<MatDialogRef<BranchDialog, BranchOverview>>(MatDialogRef);
  protected readonly data = inject<BranchDialogData>(MAT_DIALOG_DATA);
  /** Worded whole here: a template's line breaks around an @if leave a space before the punctuation. */
  protected readonly origin = `version ${this.data.version.number} of ${this.data.version.branchName}${this.data.version.message ? ` (“${this.data.version.message}”)` : ''}`;

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(80)]],
    purpose: ['', Validators.maxLength(2000)],
  });
  protected readonly saving = signal(false);

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.api.createBranch(this.data.version.id, this.form.getRawValue()).subscribe({
      next: (branch) => this.dialogRef.close(branch),
      error: (error: unknown) => {
        this.saving.set(false);
        this.notifier.formProblem(error, this.form.controls);
      },
    });
  }
}
