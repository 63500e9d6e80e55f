import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { type Member, PROJECT_ROLES, type ProjectRole } from '@laminote/contracts';
import { Notifier } from '../core/notifier';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { ProjectApi } from '../shared/project-api';
import { ROLE_LABELS } from '../shared/role-label';
import { ConfirmDialog, type ConfirmDialogData } from '../shared/confirm-dialog';

/** Who is in a project and in what role; leads and site admins add, re-role and remove members. */
@Component({
  selector: 'lam-member-list',
  imports: [
    DatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
    ProblemBanner,
    ReactiveFormsModule,
  ],
  templateUrl: './member-list.html',
  styleUrl: './member-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MemberList {
  private readonly api = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);

  readonly projectId = input.required<string>();
  /** Whether the caller may change the membership (a lead, or a site admin). */
  readonly mayManage = input(false);

  protected readonly roles = PROJECT_ROLES;
  protected readonly roleLabels = ROLE_LABELS;

  private readonly membersLoad = loader(this.projectId, (projectId) => this.api.members(projectId));
  protected readonly state = this.membersLoad.state;
  protected readonly columns = computed(() =>
    this.mayManage() ? ['name', 'email', 'role', 'status', 'actions'] : ['name', 'email', 'role', 'status'],
  );

  protected readonly addForm = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    role: ['engineer' as ProjectRole, Validators.required],
  });
  protected readonly adding = signal(false);

  protected roleText(member: Member): string {
    return ROLE_LABELS[member.role];
  }

  protected reload(): void {
    this.membersLoad.reload();
  }

  protected add(formDirective: FormGroupDirective): void {
    if (this.addForm.invalid) {
      this.addForm.markAllAsTouched();
      return;
    }
    this.adding.set(true);
    this.api.addMember(this.projectId(), this.addForm.getRawValue()).subscribe({
      next: (member) => {
        this.adding.set(false);
        this.notifier.done(`${member.name || member.email} added as ${ROLE_LABELS[member.role].toLowerCase()}`);
        // Resetting through the directive also clears its submitted state, so no error shows on the empty form.
        formDirective.resetForm({ email: '', role: this.addForm.controls.role.value });
        this.reload();
      },
      error: (error: unknown) => {
        this.adding.set(false);
        this.notifier.formProblem(error, this.addForm.controls);
      },
    });
  }

  protected changeRole(member: Member, role: ProjectRole): void {
    if (role === member.role) return;
    this.api.updateMember(this.projectId(), member.userId, { role }).subscribe({
      next: (saved) => {
        this.notifier.done(`${saved.name || saved.email} is now ${ROLE_LABELS[saved.role].toLowerCase()}`);
        this.reload();
      },
      error: (error: unknown) => {
        this.notifier.problem(error);
        // Show the role the server still holds rather than the one the select was moved to.
        this.reload();
      },
    });
  }

  protected remove(member: Member): void {
    const who = member.name || member.email;
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, {
        data: {
          title: 'Remove member',
          message: `Remove ${who} from this project? They lose access to its studies.`,
          confirmLabel: 'Remove',
        },
      })
      .afterClosed()
      .subscribe((confirmed) => {
        if (!confirmed) return;
        this.api.removeMember(this.projectId(), member.userId).subscribe({
          next: () => {
            this.notifier.done(`${who} removed`);
            this.reload();
          },
          error: (error: unknown) => this.notifier.problem(error),
        });
      });
  }
}
