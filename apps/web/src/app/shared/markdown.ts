import DOMPurify from 'dompurify';
import { Marked } from 'marked';

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/**
 * Notes are Markdown, not HTML: raw HTML in a note shows as the text it is, so no tag or handler of it
 * reaches the page's parser (and its content-security policy never has to refuse one).
 */
const notes = new Marked({
  gfm: true,
  breaks: false,
  renderer: { html: ({ text }) => text.replace(/[&<>"']/g, (c) => ESCAPES[c]!) },
});

/** Markdown to HTML that carries no script, handler or foreign frame (marked, then DOMPurify). */
export function renderMarkdown(markdown: string): string {
  const html = notes.parse(markdown, { async: false });
  return DOMPurify.sanitize(html, { USE_PROFILES: { html: true }, FORBID_TAGS: ['style', 'form', 'input', 'button'] });
}
