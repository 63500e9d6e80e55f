import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { type MatSlideToggleChange, MatSlideToggleModule } from '@angular/material/slide-toggle';
import type { Project } from '@laminote/contracts';
import { Notifier } from '../core/notifier';
import { ProjectApi } from '../shared/project-api';

/** How a project works: for now, whether engineers may branch design variants as leads do. */
@Component({
  selector: 'lam-project-settings-panel',
  imports: [MatSlideToggleModule],
  templateUrl: './project-settings-panel.html',
  styleUrl: './project-settings-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectSettingsPanel {
  private readonly api = inject(ProjectApi);
  private readonly notifier = inject(Notifier);

  readonly project = input.required<Project>();
  /** The project as the server saved it. */
  readonly projectChange = output<Project>();

  protected readonly saving = signal(false);

  protected setEngineersMayBranch(event: MatSlideToggleChange): void {
    const wanted = event.checked;
    this.saving.set(true);
    this.api.update(this.project().id, { settings: { engineersMayBranch: wanted } }).subscribe({
      next: (project) => {
        this.saving.set(false);
        this.notifier.done(
          project.settings.engineersMayBranch ? 'Engineers may now branch variants' : 'Only leads branch variants now',
        );
        this.projectChange.emit(project);
      },
      error: (error: unknown) => {
        this.saving.set(false);
        // The toggle moved before the server answered; put it back where the saved setting is.
        event.source.checked = !wanted;
        this.notifier.problem(error);
      },
    });
  }
}
