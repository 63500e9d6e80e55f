import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { NOTIFICATION_KINDS, NOTIFICATION_KIND_LABELS, type NotificationKind, type NotificationPrefs } from '@laminote/contracts';
import { Notifier } from '../core/notifier';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { InboxApi } from './inbox-api';

/** Which notifications reach the person by e-mail; the inbox always gets them all. */
@Component({
  selector: 'lam-notification-settings',
  imports: [MatProgressBarModule, MatSlideToggleModule, ProblemBanner],
  template: `
    <section class="settings" aria-labelledby="notification-settings-title">
      <h2 id="notification-settings-title">E-mail me when</h2>
      <p class="note">Everything also arrives in this inbox, whatever you choose here.</p>
      @if (state().loading && !prefs()) {
        <mat-progress-bar mode="indeterminate" aria-label="Loading your notification settings" />
      }
      @if (state().problem; as problem) {
        <lam-problem-banner [problem]="problem" (retry)="reload()" />
      }
      @if (prefs(); as prefs) {
        <ul>
          @for (kind of kinds; track kind + revision()) {
            <li>
              <mat-slide-toggle [checked]="prefs[kind]" [disabled]="saving()" (change)="set(kind, $event.checked)">{{ labels[kind] }}</mat-slide-toggle>
            </li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    .settings { border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; padding: 1rem 1.25rem; background: var(--mat-sys-surface); }
    h2 { margin: 0 0 0.25rem; font-size: 1.1rem; }
    .note { margin: 0 0 0.75rem; color: var(--mat-sys-on-surface-variant); font-size: 0.875rem; }
    ul { list-style: none; margin: 0; padding: 0; display: flex; flex-direction: column; gap: 0.5rem; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotificationSettings {
  private readonly api = inject(InboxApi);
  private readonly notifier = inject(Notifier);

  protected readonly kinds = NOTIFICATION_KINDS;
  protected readonly labels = NOTIFICATION_KIND_LABELS;
  private readonly prefsLoad = loader(
    () => null,
    () => this.api.prefs(),
  );
  protected readonly state = this.prefsLoad.state;
  private readonly saved = signal<NotificationPrefs | null>(null);
  protected readonly prefs = computed(() => this.saved() ?? this.state().value ?? null);
  /** Bumped after a failed save, so the toggles are drawn again from the stored choice. */
  protected readonly revision = signal(0);
  protected readonly saving = signal(false);

  protected reload(): void {
    this.prefsLoad.reload();
  }

  protected set(kind: NotificationKind, on: boolean): void {
    this.saving.set(true);
    this.api.updatePrefs({ [kind]: on }).subscribe({
      next: (prefs) => {
        this.saved.set(prefs);
        this.saving.set(false);
        this.notifier.done(on ? 'E-mail turned on' : 'E-mail turned off');
      },
      error: (error: unknown) => {
        this.saving.set(false);
        this.notifier.problem(error);
        // Show the stored choice again, not the toggle's position.
        this.revision.update((n) => n + 1);
      },
    });
  }
}
