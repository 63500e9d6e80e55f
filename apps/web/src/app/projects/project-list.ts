import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import type { Project } from '@laminote/contracts';
import { Auth } from '../core/auth';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { ProjectApi } from '../shared/project-api';
import { roleLabel } from '../shared/role-label';
import { NewProjectDialog } from './new-project-dialog';

/** The projects the signed-in person belongs to, with their role in each. */
@Component({
  selector: 'lam-project-list',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, MatTableModule, ProblemBanner, RouterLink],
  templateUrl: './project-list.html',
  styleUrl: './project-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectList {
  private readonly api = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly auth = inject(Auth);

  private readonly projectsLoad = loader(
    () => null,
    () => this.api.list(),
  );
  protected readonly state = this.projectsLoad.state;
  protected readonly projects = computed(() => this.state().value ?? []);
  protected readonly siteAdmin = computed(() => this.auth.me()?.user.siteAdmin ?? false);
  protected readonly columns = ['name', 'role', 'studies', 'members'] as const;

  protected role(project: Project): string {
    return roleLabel(project.role, this.siteAdmin());
  }

  protected retry(): void {
    this.projectsLoad.reload();
  }

  protected newProject(): void {
    this.dialog
      .open<NewProjectDialog, void, Project>(NewProjectDialog, { width: '32rem', autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((project) => {
        if (project) void this.router.navigate(['/projects', project.id]);
      });
  }
}
