import DOMPurify from 'dompurify';
import { marked } from 'marked';

/**
 * A comment's Markdown as HTML with no script, handler, frame, form or image (DOMPurify after marked).
 * Single line breaks are kept, as people write comments; the stored text stays exactly as typed.
 * Loaded apart from the first screen (`comment-body.ts` imports it dynamically).
 */
export function renderComment(markdown: string): string {
  const html = marked.parse(markdown, { async: false, gfm: true, breaks: true });
  return DOMPurify.sanitize(html, { USE_PROFILES: { html: true }, FORBID_TAGS: ['style', 'form', 'input', 'button', 'img', 'iframe'] });
}
