import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { DomSanitizer, type SafeHtml } from '@angular/platform-browser';
import DOMPurify from 'dompurify';
import { marked } from 'marked';

/**
 * A comment's Markdown as HTML with no script, handler, frame, form or image (DOMPurify after marked).
 * Single line breaks are kept, as people write comments; the stored text stays exactly as typed.
 */
export function renderComment(markdown: string): string {
  const html = marked.parse(markdown, { async: false, gfm: true, breaks: true });
  return DOMPurify.sanitize(html, { USE_PROFILES: { html: true }, FORBID_TAGS: ['style', 'form', 'input', 'button', 'img', 'iframe'] });
}

/** A comment's text, rendered. */
@Component({
  selector: 'lam-comment-body',
  template: `<div class="markdown" [innerHTML]="html()"></div>`,
  styles: `
    :host { display: block; overflow-wrap: anywhere; }
    .markdown :first-child { margin-top: 0; }
    .markdown :last-child { margin-bottom: 0; }
    .markdown p, .markdown ul, .markdown ol, .markdown pre, .markdown blockquote { margin: 0 0 0.5em; }
    .markdown code { font-family: 'JetBrains Mono', ui-monospace, monospace; font-size: 0.86em; background: var(--mat-sys-surface-container-high); padding: 0 0.25em; border-radius: 3px; }
    .markdown pre { overflow-x: auto; background: var(--mat-sys-surface-container-high); padding: 0.5em; border-radius: 4px; }
    .markdown pre code { background: none; padding: 0; }
    .markdown blockquote { border-left: 3px solid var(--mat-sys-outline-variant); padding-left: 0.75em; color: var(--mat-sys-on-surface-variant); }
    .markdown a { color: var(--mat-sys-primary); }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CommentBody {
  private readonly sanitizer = inject(DomSanitizer);
  readonly text = input.required<string>();
  // DOMPurify has already removed everything unsafe; Angular's own pass would only strip more.
  protected readonly html = computed((): SafeHtml => this.sanitizer.bypassSecurityTrustHtml(renderComment(this.text())));
}
