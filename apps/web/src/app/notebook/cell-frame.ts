import { CdkDragHandle } from '@angular/cdk/drag-drop';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressSpinner } from '@angular/material/progress-spinner';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { DraftCell, Problem } from '@laminote/contracts';
import { fieldPathLabel, readableMessage } from '@laminote/contracts/field-words';
import { problemMessage } from '../core/problem';
import { CellThreads } from '../review/cell-threads';
import { CellThreadsButton } from '../review/cell-threads-button';
import { RUN_STATE_INFO, cellKindInfo } from '../shared/cell-kinds';

/**
 * One cell in the stack: a head with the kind, the title, the run state and the cell's actions, and the
 * kind's own body projected below it. The frame only reports what the person asks for; the page does it.
 */
@Component({
  selector: 'lam-cell-frame',
  imports: [CdkDragHandle, CellThreads, CellThreadsButton, MatButtonModule, MatDividerModule, MatIconModule, MatMenuModule, MatProgressSpinner, MatTooltipModule],
  templateUrl: './cell-frame.html',
  styleUrl: './cell-frame.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    '[attr.data-cell-id]': 'cell().cellId',
    '[attr.data-cell-title]': 'cell().title',
    '[class.lam-cell-collapsed]': 'cell().collapsed',
    '[class]': '"lam-cell-state-" + state()',
  },
})
export class CellFrame {
  readonly cell = input.required<DraftCell>();
  /** Place in the stack, 0-based, and the stack's length: for the move actions and the position label. */
  readonly index = input.required<number>();
  readonly count = input.required<number>();
  readonly editable = input(false);
  readonly mayRun = input(false);
  readonly running = input(false);
  /** Why the last run request failed as a whole (the server refused it, or could not be reached). */
  readonly runProblem = input<Problem | null>(null);
  /**
   * False while a long study is still being drawn and this frame is below the first screen: its head
   * shows the kind, the title and the run state, and gets its buttons (comments, run, collapse, actions,
   * drag handle) with its body, so the first screen does not wait for every frame's controls.
   */
  readonly complete = input(true);

  readonly runRequested = output<void>();
  readonly duplicateRequested = output<void>();
  readonly moveRequested = output<-1 | 1>();
  readonly removeRequested = output<void>();
  readonly titleChange = output<string>();
  readonly collapsedChange = output<boolean>();

  protected readonly info = computed(() => cellKindInfo(this.cell().kind));
  protected readonly state = computed(() => (this.running() ? 'running' : this.cell().runState));
  protected readonly stateInfo = computed(() => RUN_STATE_INFO[this.state()]);
  protected readonly titleId = computed(() => `cell-title-${this.cell().cellId}`);
  protected readonly displayTitle = computed(() => this.cell().title.trim() || this.info().label);
  protected readonly runProblemText = computed(() => {
    const problem = this.runProblem();
    return problem ? problemMessage(problem) : null;
  });
  /** The engine's message when the newest run failed. */
  protected readonly failure = computed(() => {
    const output = this.cell().output;
    const error = output?.status === 'error' ? output.error : null;
    if (!error) return null;
    // In the words of the screen: the field's label, not its path (the API keeps the path).
    const kind = this.cell().kind;
    return { message: readableMessage(error.message, kind), field: error.field ? (fieldPathLabel(error.field, kind) ?? error.field) : null };
  });

  protected titleInput(event: Event): void {
    this.titleChange.emit((event.target as HTMLInputElement).value);
  }

  protected toggleCollapsed(): void {
    this.collapsedChange.emit(!this.cell().collapsed);
  }
}
