import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { type Project, type ProjectAccess, can } from '@laminote/contracts';
import { Auth } from '../core/auth';
import { loader } from '../shared/load-state';
import { NotFound } from '../shared/not-found';
import { ProblemBanner } from '../shared/problem-banner';
import { ProjectApi } from '../shared/project-api';
import { roleLabel } from '../shared/role-label';
import { MemberList } from './member-list';
import { ProjectSettingsPanel } from './project-settings-panel';
import { StudyList } from './study-list';

/** One project: its studies, its members and, for those who run it, its settings. */
@Component({
  selector: 'lam-project-page',
  imports: [
    MatIconModule,
    MatProgressBarModule,
    MatTabsModule,
    MemberList,
    NotFound,
    ProblemBanner,
    ProjectSettingsPanel,
    RouterLink,
    StudyList,
  ],
  templateUrl: './project-page.html',
  styleUrl: './project-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectPage {
  private readonly api = inject(ProjectApi);
  private readonly auth = inject(Auth);
  private readonly title = inject(Title);

  /** From the route. */
  readonly projectId = input.required<string>();

  private readonly projectLoad = loader(this.projectId, (id) => this.api.get(id));
  protected readonly state = this.projectLoad.state;
  /** The loaded project, replaced in place when its settings change here. */
  protected readonly project = linkedSignal(() => this.state().value);
  protected readonly notFound = computed(() => this.state().problem?.status === 404);

  protected readonly access = computed((): ProjectAccess | null => {
    const project = this.project();
    if (!project) return null;
    return { role: project.role, siteAdmin: this.auth.me()?.user.siteAdmin ?? false, settings: project.settings };
  });
  protected readonly roleText = computed(() => {
    const access = this.access();
    return access ? roleLabel(access.role, access.siteAdmin) : '';
  });
  protected readonly mayEditStudies = computed(() => this.allowed('editStudy'));
  protected readonly mayManageMembers = computed(() => this.allowed('manageMembers'));
  protected readonly mayManageSettings = computed(() => this.allowed('manageSettings'));

  constructor() {
    effect(() => {
      const project = this.project();
      if (project) this.title.setTitle(`${project.name} · Laminote`);
    });
  }

  private allowed(action: Parameters<typeof can>[1]): boolean {
    const access = this.access();
    return access !== null && can(access, action);
  }

  protected retry(): void {
    this.projectLoad.reload();
  }

  protected projectChanged(project: Project): void {
    this.project.set(project);
  }
}
