import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { cellKindInfo } from '../shared/cell-kinds';
import type { CellChange } from '../shared/draft-diff';
import type { DraftConflict } from '../shared/draft-session';

export type ConflictChoice = 'mine' | 'theirs';

const CHANGE_WORDS: Record<CellChange['change'], string> = {
  added: 'added',
  removed: 'removed',
  edited: 'changed',
  moved: 'moved',
};

interface ChangeLine {
  readonly cellId: string;
  readonly icon: string;
  readonly title: string;
  readonly kindLabel: string;
  readonly what: string;
  readonly clash: boolean;
}

function lines(changes: readonly CellChange[], clashing: ReadonlySet<string>): ChangeLine[] {
  return changes.map((change) => {
    const info = cellKindInfo(change.kind);
    const parts = change.parts.filter((p) => p !== 'collapsed');
    return {
      cellId: change.cellId,
      icon: info.icon,
      title: change.title.trim() || info.label,
      kindLabel: info.label,
      what: CHANGE_WORDS[change.change] + (change.change === 'edited' && parts.length > 0 ? ` (${parts.join(', ')})` : ''),
      clash: clashing.has(change.cellId),
    };
  });
}

/**
 * Someone else saved the draft first. Shows what they changed and what is unsaved here, cell by cell,
 * and lets the person choose; closing without a choice is not possible, so nothing is dropped silently.
 */
@Component({
  selector: 'lam-conflict-dialog',
  imports: [DatePipe, MatButtonModule, MatDialogModule, MatIconModule],
  templateUrl: './conflict-dialog.html',
  styleUrl: './conflict-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ConflictDialog {
  protected readonly conflict = inject<DraftConflict>(MAT_DIALOG_DATA);
  protected readonly theirs = computed(() => lines(this.conflict.theirChanges, this.conflict.clashing));
  protected readonly mine = computed(() => lines(this.conflict.myChanges, this.conflict.clashing));
  protected readonly who = computed(() => this.conflict.theirs.updatedBy?.name ?? 'Someone');
  protected readonly keepMineNote = computed(() => {
    const added = this.conflict.theirChanges.filter((c) => c.change === 'added').length;
    const clash = this.conflict.clashing.size > 0 ? ': where you both changed a cell, yours wins' : '';
    const trash =
      added === 0 ? '' : `; ${added === 1 ? 'the cell they added goes' : `the ${added} cells they added go`} to “Recently removed”, from where it can be brought back`;
    return clash + trash;
  });
}
