import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import type { Study } from '@laminote/contracts';
import { type Observable, forkJoin, map } from 'rxjs';
import { Notifier } from '../core/notifier';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { StudyApi } from '../shared/study-api';
import { StudyDialog, type StudyDialogData } from './study-dialog';
import { StudyImportDialog, type StudyImportDialogData, type StudyImportOutcome } from './study-import-dialog';
import { STUDY_IMPORT_MAX_BYTES, readStudyFile } from './study-import';

/** A project's studies; engineers and leads create, import, rename, archive and restore them. */
@Component({
  selector: 'lam-study-list',
  imports: [
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatProgressBarModule,
    MatSlideToggleModule,
    MatTableModule,
    ProblemBanner,
    RouterLink,
  ],
  templateUrl: './study-list.html',
  styleUrl: './study-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyList {
  private readonly api = inject(StudyApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly router = inject(Router);

  readonly projectId = input.required<string>();
  /** Whether the caller may create, rename and archive studies here. */
  readonly mayEdit = input(false);

  protected readonly showArchived = signal(false);
  private readonly studiesLoad = loader(
    () => ({ projectId: this.projectId(), archived: this.showArchived() }),
    ({ projectId, archived }) => (archived ? this.activeThenArchived(projectId) : this.api.list(projectId, { archived: false })),
  );
  protected readonly state = this.studiesLoad.state;
  protected readonly columns = computed(() =>
    this.mayEdit() ? ['title', 'createdBy', 'updatedAt', 'actions'] : ['title', 'createdBy', 'updatedAt'],
  );

  /** The server lists active and archived studies apart; with the toggle on, both show, archived last. */
  private activeThenArchived(projectId: string): Observable<Study[]> {
    return forkJoin([this.api.list(projectId, { archived: false }), this.api.list(projectId, { archived: true })]).pipe(
      map(([active, archived]) => [...active, ...archived]),
    );
  }

  protected reload(): void {
    this.studiesLoad.reload();
  }

  /** A new study opens at once: the next thing anyone does with it is add cells. */
  protected create(): void {
    this.openDialog({ projectId: this.projectId() }, (study) => `Study “${study.title}” created`, (study) => {
      void this.router.navigate(['/studies', study.id]);
    });
  }

  protected readonly importing = signal(false);
  /** Why the chosen file was not imported, naming the file and what is wrong; stays until dismissed. */
  protected readonly importProblem = signal<string | null>(null);

  /**
   * "Import a study": reads the chosen study export in the browser (so a file that is not one is named
   * at once), asks for the new study's title (the export's to begin with), makes it here and opens it.
   */
  protected async importChosen(event: Event): Promise<void> {
    const field = event.target as HTMLInputElement;
    const file = field.files?.[0];
    field.value = ''; // the same file can be chosen again after fixing it
    if (!file) return;
    this.importProblem.set(null);
    if (file.size > STUDY_IMPORT_MAX_BYTES) {
      this.importProblem.set(`“${file.name}” is not imported: at ${(file.size / 1048576).toFixed(1)} MB it is larger than a study export can be (${STUDY_IMPORT_MAX_BYTES / 1048576} MB).`);
      return;
    }
    let text: string;
    try {
      text = await file.text();
    } catch {
      this.importProblem.set(`“${file.name}” could not be read from your disk; choose it again.`);
      return;
    }
    const reading = readStudyFile(file.name, text);
    if (!reading.ok) {
      this.importProblem.set(reading.message);
      return;
    }
    this.importing.set(true);
    this.dialog
      .open<StudyImportDialog, StudyImportDialogData, StudyImportOutcome>(StudyImportDialog, { data: { projectId: this.projectId(), fileName: file.name, document: reading.document }, width: '34rem' })
      .afterClosed()
      .subscribe((outcome) => {
        this.importing.set(false);
        if (!outcome) return;
        if ('problem' in outcome) {
          this.importProblem.set(`“${file.name}” was not imported: ${outcome.problem}`);
          return;
        }
        const made = outcome.made;
        const rerun = made.outputsLeft > 0 ? `; ${made.outputsLeft} to run again here` : '';
        this.notifier.done(`Study “${made.title}” imported: ${made.cellCount} cells, ${made.outputsKept} results kept${rerun}`);
        void this.router.navigate(['/studies', made.studyId]);
      });
  }

  protected rename(study: Study): void {
    this.openDialog({ study }, (saved) => `Study renamed to “${saved.title}”`);
  }

  protected setArchived(study: Study, archived: boolean): void {
    this.api.update(study.id, { archived }).subscribe({
      next: (saved) => {
        this.notifier.done(archived ? `“${saved.title}” archived` : `“${saved.title}” restored`);
        this.reload();
      },
      error: (error: unknown) => this.notifier.problem(error),
    });
  }

  private openDialog(data: StudyDialogData, message: (study: Study) => string, then: (study: Study) => void = () => this.reload()): void {
    this.dialog
      .open<StudyDialog, StudyDialogData, Study>(StudyDialog, { data, width: '34rem' })
      .afterClosed()
      .subscribe((study) => {
        if (!study) return;
        this.notifier.done(message(study));
        then(study);
      });
  }
}
