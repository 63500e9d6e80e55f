import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { Member, VersionReviewDetail } from '@laminote/contracts';
import { catchError, of } from 'rxjs';
import { Notifier } from '../core/notifier';
import { ReviewApi } from './review-api';
import { ThreadStore } from './thread-store';

export interface SendForReviewData {
  readonly studyId: string;
  readonly versionId: string;
  readonly versionNumber: number;
  readonly branchName: string;
}

/**
 * Sends one version for review to named reviewers of the project, with a note; the same step from the
 * version page, the version bar and right after saving a version. Closes with the version's review.
 */
@Component({
  selector: 'lam-send-for-review-dialog',
  imports: [FormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatSelectModule],
  template: `
    <h2 mat-dialog-title>Send version {{ data.versionNumber }} of {{ data.branchName }} for review</h2>
    <form (submit)="$event.preventDefault(); send()" aria-label="Send this version for review">
      <mat-dialog-content class="fields">
        <mat-form-field>
          <mat-label>Reviewers</mat-label>
          <mat-select multiple [value]="chosen()" (valueChange)="chosen.set($event)" name="reviewers">
            @for (m of reviewers(); track m.userId) {
              <mat-option [value]="m.userId">{{ m.name }}</mat-option>
            }
          </mat-select>
          @if (members() !== null && reviewers().length === 0) {
            <mat-hint>This project has no reviewers; a lead adds them on the project page.</mat-hint>
          } @else {
            <mat-hint>Each is notified and asked for a verdict on this version.</mat-hint>
          }
        </mat-form-field>
        <mat-form-field>
          <mat-label>Note to the reviewers (optional)</mat-label>
          <textarea matInput rows="3" name="message" maxlength="4000" [ngModel]="message()" (ngModelChange)="message.set($event)"></textarea>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Not now</button>
        <button mat-flat-button type="submit" [disabled]="busy() || chosen().length === 0">Send for review</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .fields {
      display: flex;
      flex-direction: column;
      gap: 0.25rem;
      padding-top: 0.5rem !important;
    }
    .fields .mat-mdc-form-field {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SendForReviewDialog {
  private readonly api = inject(ReviewApi);
  private readonly store = inject(ThreadStore);
  private readonly notifier = inject(Notifier);
  private readonly dialogRef = inject<MatDialogRef<SendForReviewDialog, VersionReviewDetail>>(MatDialogRef);
  protected readonly data = inject<SendForReviewData>(MAT_DIALOG_DATA);

  protected readonly members = toSignal(this.store.members(this.data.studyId).pipe(catchError(() => of([] as Member[]))), { initialValue: null });
  protected readonly reviewers = computed(() => (this.members() ?? []).filter((m) => m.role === 'reviewer'));
  protected readonly chosen = signal<string[]>([]);
  protected readonly message = signal('');
  protected readonly busy = signal(false);

  protected send(): void {
    const reviewerIds = this.chosen();
    if (reviewerIds.length === 0 || this.busy()) return;
    this.busy.set(true);
    this.api.requestReview(this.data.versionId, { reviewerIds, message: this.message() }).subscribe({
      next: (review) => {
        this.store.forgetReview(this.data.studyId);
        this.notifier.done(reviewerIds.length === 1 ? 'Sent for review; the reviewer was notified' : 'Sent for review; the reviewers were notified');
        this.dialogRef.close(review);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.notifier.problem(error);
      },
    });
  }
}
