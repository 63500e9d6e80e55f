import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import type { StudyReview } from '@laminote/contracts';
import { catchError, of, switchMap } from 'rxjs';
import { ThreadStore } from './thread-store';
import { verdictPast } from './verdict-words';

/**
 * For a version in the history with no verdict of its own: the nearest earlier version's verdict, said
 * to apply to that older version (so a newer version never looks approved by someone else's verdict).
 */
@Component({
  selector: 'lam-earlier-verdict',
  imports: [MatIconModule],
  template: `
    @if (earlier(); as e) {
      <span class="earlier" [attr.data-state]="e.state" [attr.title]="'The verdict was given on version ' + e.versionNumber + ', an older version; this one has none yet'">
        <mat-icon aria-hidden="true">subdirectory_arrow_right</mat-icon>v{{ e.versionNumber }}{{ e.branchName !== branchName() ? ' (' + e.branchName + ')' : '' }}
        {{ past(e.state) }} · not this version
      </span>
    }
  `,
  styles: `
    .earlier { display: inline-flex; align-items: center; gap: 0.2rem; font-size: 0.75rem; color: var(--mat-sys-on-surface-variant); border: 1px dashed var(--mat-sys-outline-variant); border-radius: 999px; padding: 0 0.5rem; }
    mat-icon { font-size: 14px; width: 14px; height: 14px; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EarlierVerdict {
  private readonly store = inject(ThreadStore);

  readonly studyId = input.required<string>();
  readonly versionId = input.required<string>();
  readonly branchName = input<string | null>(null);

  protected readonly past = verdictPast;
  private readonly review = toSignal(
    toObservable(this.studyId).pipe(switchMap((id) => this.store.studyReview(id).pipe(catchError(() => of(null as StudyReview | null))))),
    { initialValue: null },
  );
  protected readonly earlier = computed(() => {
    const summary = this.review()?.versions.find((v) => v.versionId === this.versionId());
    return summary && summary.approvals + summary.changesRequested === 0 ? summary.earlierVerdict : null;
  });
}
