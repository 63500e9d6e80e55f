import { ChangeDetectionStrategy, Component, PendingTasks, ViewEncapsulation, computed, inject, input } from '@angular/core';
import { DomSanitizer, type SafeHtml } from '@angular/platform-browser';
import { lazyModule } from '../shared/lazy-module';

/**
 * Marks `@Name` of the given people in rendered, already sanitised HTML, in text only (never inside a
 * tag, a link or code), so mentions read as such.
 */
export function markMentions(html: string, names: readonly string[]): string {
  const wanted = names.filter((n) => n.trim()).sort((a, b) => b.length - a.length);
  if (wanted.length === 0 || !html.includes('@')) return html;
  const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const pattern = new RegExp(`(^|[^\\p{L}\\p{N}_.-])@(${wanted.map(escape).join('|')})(?![\\p{L}\\p{N}_@])`, 'giu');
  const template = document.createElement('template');
  template.innerHTML = html;
  const walker = document.createTreeWalker(template.content, NodeFilter.SHOW_TEXT);
  const texts: Text[] = [];
  for (let node = walker.nextNode(); node; node = walker.nextNode()) {
    if (!(node.parentElement?.closest('a, code, pre') ?? null)) texts.push(node as Text);
  }
  for (const text of texts) {
    const value = text.data;
    pattern.lastIndex = 0;
    if (!pattern.test(value)) continue;
    pattern.lastIndex = 0;
    const fragment = document.createDocumentFragment();
    let last = 0;
    for (const match of value.matchAll(pattern)) {
      const at = match.index + match[1]!.length;
      fragment.append(value.slice(last, at));
      const span = document.createElement('span');
      span.className = 'mention';
      span.textContent = `@${match[2]}`;
      fragment.append(span);
      last = at + 1 + match[2]!.length;
    }
    fragment.append(value.slice(last));
    text.replaceWith(fragment);
  }
  return template.innerHTML;
}

/** The comment renderer (marked and DOMPurify), fetched once, apart from the first screen. */
const renderer = lazyModule(() => import('./comment-markdown'));

/** A comment's text, rendered, with the mentioned people marked. */
@Component({
  selector: 'lam-comment-body',
  template: `<div class="markdown" [innerHTML]="html()" [attr.aria-busy]="html() === null"></div>`,
  // The rendered HTML comes in through innerHTML, which emulated encapsulation does not reach.
  encapsulation: ViewEncapsulation.None,
  styles: `
    lam-comment-body { display: block; overflow-wrap: anywhere; }
    lam-comment-body .markdown > :first-child { margin-top: 0; }
    lam-comment-body .markdown > :last-child { margin-bottom: 0; }
    lam-comment-body .markdown :is(p, ul, ol, pre, blockquote) { margin: 0 0 0.5em; }
    lam-comment-body .markdown code { font-family: 'JetBrains Mono', ui-monospace, monospace; font-size: 0.86em; background: var(--mat-sys-surface-container-high); padding: 0 0.25em; border-radius: 3px; }
    lam-comment-body .markdown pre { overflow-x: auto; background: var(--mat-sys-surface-container-high); padding: 0.5em; border-radius: 4px; }
    lam-comment-body .markdown pre code { background: none; padding: 0; }
    lam-comment-body .markdown blockquote { border-left: 3px solid var(--mat-sys-outline-variant); padding-left: 0.75em; color: var(--mat-sys-on-surface-variant); }
    lam-comment-body .markdown a { color: var(--mat-sys-primary); }
    lam-comment-body .markdown .mention { color: var(--mat-sys-on-tertiary-container); background: var(--mat-sys-tertiary-container); border-radius: 4px; padding: 0 0.2em; font-weight: 700; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CommentBody {
  private readonly sanitizer = inject(DomSanitizer);
  readonly text = input.required<string>();
  /** Names of the people who can be mentioned (the project's members). */
  readonly people = input<readonly string[]>([]);
  // DOMPurify has already removed everything unsafe; Angular's own pass would only strip more.
  protected readonly html = computed((): SafeHtml | null => {
    const render = renderer.module();
    return render ? this.sanitizer.bypassSecurityTrustHtml(markMentions(render.renderComment(this.text()), this.people())) : null;
  });

  constructor() {
    if (!renderer.module()) inject(PendingTasks).run(renderer.load);
  }
}
