import { TextFieldModule } from '@angular/cdk/text-field';
import { ChangeDetectionStrategy, Component, ElementRef, computed, input, linkedSignal, output, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { Member } from '@laminote/contracts';
import { COMMENT_MAX_LENGTH } from '@laminote/contracts/limits';

let nextId = 0;

/** The `@…` being typed just before the caret, if any: at the start or after white space. */
export function mentionQuery(text: string, caret: number): { start: number; query: string } | null {
  const before = text.slice(0, caret);
  const match = /(?:^|\s)@([^\s@]{0,40}(?: [^\s@]{0,40})?)$/u.exec(before);
  if (!match) return null;
  return { start: caret - match[1]!.length - 1, query: match[1]! };
}

/** Members whose name or e-mail starts a word with the query (all of them for an empty query). */
export function mentionCandidates(members: readonly Member[], query: string, limit = 6): Member[] {
  const q = query.trim().toLowerCase();
  const words = (m: Member) => [...m.name.toLowerCase().split(/\s+/), m.name.toLowerCase(), m.email.toLowerCase()];
  return members.filter((m) => q === '' || words(m).some((w) => w.startsWith(q))).slice(0, limit);
}

/**
 * A comment box: Markdown text, with `@` offering the project's members as the person types (arrow
 * keys and Enter or Tab to pick, Escape to close). Ctrl/⌘+Enter sends. The text stays until the
 * parent says it was saved (`clear()`), so nothing typed is lost when sending fails.
 */
@Component({
  selector: 'lam-comment-box',
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, TextFieldModule],
  templateUrl: './comment-box.html',
  styleUrl: './comment-box.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CommentBox {
  readonly members = input<readonly Member[]>([]);
  readonly label = input('Comment');
  readonly placeholder = input('Write a comment; @ mentions a member; Markdown works');
  readonly submitLabel = input('Comment');
  readonly busy = input(false);
  readonly initial = input('');
  readonly cancellable = input(false);

  readonly submitted = output<string>();
  readonly cancelled = output<void>();

  private readonly textarea = viewChild.required<ElementRef<HTMLTextAreaElement>>('textarea');

  protected readonly id = `lam-comment-box-${nextId++}`;
  protected readonly maxLength = COMMENT_MAX_LENGTH;
  /** Starts as `initial` (the text being edited), then follows what the person types. */
  protected readonly text = linkedSignal(() => this.initial());
  private readonly query = signal<{ start: number; query: string } | null>(null);
  protected readonly active = signal(0);
  protected readonly candidates = computed(() => {
    const q = this.query();
    return q ? mentionCandidates(this.members(), q.query) : [];
  });
  protected readonly suggesting = computed(() => this.candidates().length > 0);
  protected readonly empty = computed(() => this.text().trim() === '');

  /** Empties the box after the parent saved what it sent. */
  clear(): void {
    this.text.set('');
    this.query.set(null);
  }

  focus(): void {
    this.textarea().nativeElement.focus();
  }

  protected onInput(event: Event): void {
    const area = event.target as HTMLTextAreaElement;
    this.swallowSpaceAfterMention(area);
    this.text.set(area.value);
    this.track(area);
  }

  /** Where a picked mention's own trailing space ends, until the next keystroke. */
  private afterMention: number | null = null;

  /**
   * A picked mention brings its space with it; a person who types one out of habit would leave two.
   * The first space typed right after the mention is taken as that one.
   */
  private swallowSpaceAfterMention(area: HTMLTextAreaElement): void {
    const at = this.afterMention;
    this.afterMention = null;
    if (at === null || area.value.length !== this.text().length + 1 || area.value.slice(at - 1, at + 1) !== '  ') return;
    area.value = area.value.slice(0, at) + area.value.slice(at + 1);
    area.setSelectionRange(at, at);
  }

  protected track(area: HTMLTextAreaElement): void {
    const q = area.selectionStart === area.selectionEnd ? mentionQuery(area.value, area.selectionStart) : null;
    if (q?.query !== this.query()?.query) this.active.set(0);
    this.query.set(q);
  }

  protected onKeydown(event: KeyboardEvent): void {
    if (this.suggesting()) {
      const n = this.candidates().length;
      if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
        event.preventDefault();
        this.active.update((i) => (i + (event.key === 'ArrowDown' ? 1 : n - 1)) % n);
        return;
      }
      if (event.key === 'Enter' || event.key === 'Tab') {
        event.preventDefault();
        this.pick(this.candidates()[this.active()]!);
        return;
      }
      if (event.key === 'Escape') {
        event.preventDefault();
        event.stopPropagation();
        this.query.set(null);
        return;
      }
    }
    if (event.key === 'Enter' && (event.ctrlKey || event.metaKey)) {
      event.preventDefault();
      this.send();
    }
  }

  protected pick(member: Member): void {
    const q = this.query();
    if (!q) return;
    const area = this.textarea().nativeElement;
    const caret = q.start + 1 + q.query.length;
    const rest = area.value.slice(caret);
    // No second space where the text after the mention already starts with one.
    const inserted = /^\s/.test(rest) ? `@${member.name}` : `@${member.name} `;
    const value = area.value.slice(0, q.start) + inserted + rest;
    area.value = value;
    this.text.set(value);
    this.query.set(null);
    const at = q.start + inserted.length;
    this.afterMention = inserted.endsWith(' ') ? at : null;
    area.setSelectionRange(at, at);
    area.focus();
  }

  protected send(): void {
    const body = this.text().trim();
    if (!body || this.busy()) return;
    this.submitted.emit(body);
  }
}
