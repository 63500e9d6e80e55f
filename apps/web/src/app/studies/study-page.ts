import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { Auth } from '../core/auth';
import { loader } from '../shared/load-state';
import { NotFound } from '../shared/not-found';
import { ProblemBanner } from '../shared/problem-banner';
import { StudyApi } from '../shared/study-api';

/**
 * A study's notebook. For now it shows the study and an empty cell stack; the cells, versions and
 * review arrive with the notebook work.
 */
@Component({
  selector: 'lam-study-page',
  imports: [DatePipe, MatIconModule, MatProgressBarModule, NotFound, ProblemBanner, RouterLink],
  templateUrl: './study-page.html',
  styleUrl: './study-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyPage {
  private readonly api = inject(StudyApi);
  private readonly title = inject(Title);
  private readonly auth = inject(Auth);

  /** From the route. */
  readonly studyId = input.required<string>();

  private readonly studyLoad = loader(this.studyId, (id) => this.api.get(id));
  protected readonly state = this.studyLoad.state;
  protected readonly notFound = computed(() => this.state().problem?.status === 404);
  /** The project's name from the person's memberships; a site admin outside the project sees "Project". */
  protected readonly projectName = computed(() => {
    const projectId = this.state().value?.projectId;
    return this.auth.me()?.memberships.find((m) => m.projectId === projectId)?.projectName ?? 'Project';
  });

  constructor() {
    effect(() => {
      const study = this.state().value;
      if (study) this.title.setTitle(`${study.title} · Laminote`);
    });
  }

  protected retry(): void {
    this.studyLoad.reload();
  }
}
