import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { cellReviewContext } from './cell-review-context';
import { ThreadStore } from './thread-store';

/** The toggle in a cell's head: how many threads the cell has, and opens or closes them below the cell. */
@Component({
  selector: 'lam-cell-threads-button',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule],
  template: `
    @if (shown()) {
    <button
      mat-button
      type="button"
      class="threads-button"
      [class.has-open]="review.openCount() > 0"
      (click)="toggle()"
      [attr.aria-expanded]="open()"
      [attr.aria-label]="label()"
      [matTooltip]="tooltip()"
    >
      <mat-icon aria-hidden="true">{{ review.threads().length ? 'forum' : 'add_comment' }}</mat-icon>
      @if (review.threads().length) {
        <span class="count lam-mono">{{ review.openCount() }}<span class="of">/{{ review.threads().length }}</span></span>
      } @else {
        <span class="count">Comment</span>
      }
    </button>
    }
  `,
  styles: `
    .threads-button { --mat-button-text-container-height: 32px; min-width: 0; color: var(--mat-sys-on-surface-variant); }
    .threads-button.has-open { color: var(--mat-sys-tertiary); font-weight: 700; }
    .count { font-size: 0.8rem; }
    .of { color: var(--mat-sys-on-surface-variant); font-weight: 400; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CellThreadsButton {
  private readonly store = inject(ThreadStore);

  readonly cellId = input.required<string>();
  readonly studyId = input<string | undefined>(undefined);
  readonly versionId = input<string | undefined>(undefined);
  readonly branchId = input<string | undefined>(undefined);

  protected readonly review = cellReviewContext({ cellId: this.cellId, studyId: this.studyId, versionId: this.versionId, branchId: this.branchId });
  protected readonly open = computed(() => this.store.openCellIds().has(this.cellId()));
  /** Someone who may not comment sees the button only when there are comments to read. */
  protected readonly shown = computed(() => this.review.canComment() || this.review.threads().length > 0);
  protected readonly label = computed(() => {
    const all = this.review.threads().length;
    const open = this.review.openCount();
    const what = all === 0 ? 'Comment on this cell' : `${open} open of ${all} ${all === 1 ? 'thread' : 'threads'}`;
    return `${this.open() ? 'Hide' : 'Show'} comments: ${what}`;
  });
  protected readonly tooltip = computed(() => (this.review.threads().length ? `${this.review.openCount()} open of ${this.review.threads().length} threads` : 'Comment on this cell'));

  protected toggle(): void {
    this.store.setOpen(this.cellId(), !this.open());
  }
}
