import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { DraftCell, VersionSummary } from '@laminote/contracts';
import { CELL_KIND_LABELS } from '@laminote/contracts/cell-kinds';
import { Auth } from '../core/auth';
import { DraftSession } from '../shared/draft-session';
import { whenIdle } from '../shared/lazy-module';
import { VersionApi } from '../versions/version-api';
import { type LookChanges, changesSince, readSnapshot, snapshotOf, writeSnapshot } from './last-look';

/**
 * "Since you last looked": on opening a study, what changed on this branch since the person last had
 * it open in this browser — versions others saved, cells added, removed or changed — in one line they
 * can dismiss. What they see (and do) from then on is remembered for next time.
 */
@Component({
  selector: 'lam-since-last-look',
  imports: [DatePipe, MatButtonModule, MatIconModule],
  template: `
    @if (changes(); as c) {
      <aside class="since" role="status" aria-label="Changes since you last looked">
        <mat-icon aria-hidden="true">history_toggle_off</mat-icon>
        <div class="what">
          <strong>Since you last looked</strong> (<time [attr.datetime]="c.seenAt">{{ c.seenAt | date: 'd MMM, HH:mm' }}</time>):
          <ul>
            @for (v of c.versions; track v.number) {
              <li>{{ v.author }} saved version {{ v.number }} (“{{ v.message }}”)</li>
            }
            @if (c.changed.length) {
              <li>changed: {{ c.changed.join(', ') }}</li>
            }
            @if (c.added.length) {
              <li>added: {{ c.added.join(', ') }}</li>
            }
            @if (c.removed.length) {
              <li>removed: {{ c.removed.join(', ') }}</li>
            }
          </ul>
        </div>
        <button mat-button type="button" class="dismiss" (click)="dismissed.set(true)">Dismiss</button>
      </aside>
    }
  `,
  styles: `
    .since { display: flex; align-items: flex-start; gap: 0.5rem; margin: 0 0 0.75rem; padding: 0.5rem 0.75rem; border: 1px solid var(--mat-sys-outline-variant); border-left: 3px solid var(--mat-sys-tertiary); border-radius: 6px; background: var(--mat-sys-surface-container-low); font: var(--mat-sys-body-small); }
    .since mat-icon { color: var(--mat-sys-tertiary); }
    .what { flex: 1; }
    ul { margin: 0.25rem 0 0; padding-left: 1.1rem; }
    .dismiss { --mat-button-text-container-height: 28px; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SinceLastLook {
  private readonly session = inject(DraftSession);
  private readonly auth = inject(Auth);
  private readonly versions = inject(VersionApi);

  readonly studyId = input.required<string>();
  readonly branchId = input.required<string>();

  private readonly found = signal<LookChanges | null>(null);
  protected readonly dismissed = signal(false);
  protected readonly changes = computed(() => (this.dismissed() ? null : this.found()));
  private readonly person = computed(() => this.auth.me()?.user.id ?? null);

  constructor() {
    let comparedFor: string | null = null;
    let pending: ReturnType<typeof setTimeout> | null = null;
    // The comparison on opening, once it has run (the edits' snapshots wait for it, so that what was
    // seen before is read before anything overwrites it).
    let opened: Promise<void> = Promise.resolve();
    let destroyed = false;
    effect(() => {
      const draft = this.session.draft();
      const cells = this.session.cells();
      const revision = this.session.revision();
      const person = this.person();
      const branchId = this.branchId();
      if (!draft || draft.branchId !== branchId || !person) return;
      untracked(() => {
        if (comparedFor !== branchId) {
          // Once per branch opened: compare with what was seen, then remember what is seen now (the
          // cells as opened). At the browser's first idle moment, not inside the study's first drawing:
          // reading the browser's storage and fingerprinting every cell's inputs took about 25 ms of a
          // cold open of a 20-cell study.
          comparedFor = branchId;
          this.dismissed.set(false);
          opened = whenIdle().then(() => {
            if (!destroyed && comparedFor === branchId) this.compare(person, branchId, cells, revision);
          });
          return;
        }
        // The person's own edits are what they have seen.
        if (pending) clearTimeout(pending);
        pending = setTimeout(
          () =>
            void opened.then(() => {
              if (!destroyed) writeSnapshot(person, branchId, snapshotOf(this.session.cells(), this.session.revision()));
            }),
          500,
        );
      });
    });
    inject(DestroyRef).onDestroy(() => {
      destroyed = true;
      if (pending) clearTimeout(pending);
      const person = this.person();
      if (person && this.session.draft()?.branchId === this.branchId()) writeSnapshot(person, this.branchId(), snapshotOf(this.session.cells(), this.session.revision()));
    });
  }

  /** Says what changed since the snapshot last kept, and keeps the one of the cells as opened. */
  private compare(person: string, branchId: string, cells: readonly DraftCell[], revision: number): void {
    const before = readSnapshot(person, branchId);
    writeSnapshot(person, branchId, snapshotOf(cells, revision));
    if (!before) return;
    // An unchanged draft: nobody worked on the branch since (a version is saved from a draft edited first).
    if (before.revision === revision) return;
    this.versions.history(this.studyId()).subscribe({
      next: (history) => {
        const onBranch = history.versions.filter((v: VersionSummary) => v.branchId === branchId);
        this.found.set(changesSince(before, cells, revision, onBranch, person, (k) => CELL_KIND_LABELS[k]));
      },
      error: () => this.found.set(changesSince(before, cells, revision, [], person, (k) => CELL_KIND_LABELS[k])),
    });
  }
}
