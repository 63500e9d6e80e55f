import { TextFieldModule } from '@angular/cdk/text-field';
import { ChangeDetectionStrategy, Component, PendingTasks, computed, inject, input, linkedSignal, signal, untracked } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { DomSanitizer, type SafeHtml } from '@angular/platform-browser';
import type { DraftCell } from '@laminote/contracts';
import { bindCellForm } from '../cell-form';
import { DraftSession } from '../../shared/draft-session';

interface NoteFormValue {
  markdown: string;
}

/** Note: the team's reasoning in Markdown, written in a text box and read rendered. */
@Component({
  selector: 'lam-note-cell',
  imports: [MatButtonToggleModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule, TextFieldModule],
  template: `
    @if (session.editable()) {
      <mat-button-toggle-group
        class="view"
        [value]="view()"
        (change)="view.set($event.value)"
        aria-label="Write or read the note"
        hideSingleSelectionIndicator
      >
        <mat-button-toggle value="edit">Write</mat-button-toggle>
        <mat-button-toggle value="preview">Read</mat-button-toggle>
      </mat-button-toggle-group>
    }
    @if (view() === 'edit' && session.editable()) {
      <form [formGroup]="form" (submit)="$event.preventDefault()">
        <mat-form-field class="note-field" subscriptSizing="dynamic">
          <mat-label>Note (Markdown)</mat-label>
          <textarea matInput formControlName="markdown" rows="6" cdkTextareaAutosize></textarea>
          <mat-hint>**bold**, _italic_, lists, tables, [links](https://…); rendered without scripts or styles</mat-hint>
        </mat-form-field>
      </form>
    } @else {
      @if (isEmpty()) {
        <p class="empty">Empty note.</p>
      } @else {
        <div class="rendered" [innerHTML]="html()" [attr.aria-busy]="html() === null"></div>
      }
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .view {
      --mat-button-toggle-height: 28px;
      margin-bottom: 0.5rem;
    }
    .note-field {
      width: 100%;
    }
    textarea {
      font-family: var(--lam-mono);
      font-size: 0.8125rem;
    }
    .rendered {
      max-width: 52rem;
      line-height: 1.5;
    }
    .rendered :is(h1, h2, h3) {
      margin: 0.75rem 0 0.25rem;
    }
    .rendered :is(code, pre) {
      font-family: var(--lam-mono);
    }
    .rendered table {
      border-collapse: collapse;
    }
    .rendered :is(td, th) {
      border: 1px solid var(--mat-sys-outline-variant);
      padding: 0.2rem 0.5rem;
    }
    .empty {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NoteCell {
  private readonly sanitizer = inject(DomSanitizer);
  protected readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();

  protected readonly form = new FormGroup({ markdown: new FormControl('', { nonNullable: true }) });
  /** The Markdown renderer (marked and DOMPurify), loaded apart from the first screen. */
  private readonly renderer = signal<typeof import('../../shared/markdown') | null>(null);

  constructor() {
    inject(PendingTasks).run(() => import('../../shared/markdown').then((renderer) => this.renderer.set(renderer)));
    bindCellForm<NoteFormValue>({
      form: this.form,
      cell: this.cell,
      toForm: (inputs) => ({ markdown: typeof inputs['markdown'] === 'string' ? inputs['markdown'] : '' }),
      fromForm: (value, previous) => ({ ...previous, markdown: value.markdown }),
    });
  }

  private readonly markdown = computed(() => {
    const value = this.cell().inputs['markdown'];
    return typeof value === 'string' ? value : '';
  });
  /** A new, empty note opens for writing; one with text opens for reading. */
  protected readonly view = linkedSignal<string, 'edit' | 'preview'>({
    source: () => this.cell().cellId,
    computation: () => untracked(() => (this.markdown().trim() === '' ? 'edit' : 'preview')),
  });
  protected readonly isEmpty = computed(() => this.markdown().trim() === '');
  // DOMPurify has already removed everything unsafe; Angular's own pass would only strip more styling.
  protected readonly html = computed((): SafeHtml | null => {
    const renderer = this.renderer();
    return renderer ? this.sanitizer.bypassSecurityTrustHtml(renderer.renderMarkdown(this.markdown())) : null;
  });
}
