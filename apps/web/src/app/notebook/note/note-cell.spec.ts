import { describe, expect, it } from 'vitest';
import { renderMarkdown } from '../../shared/markdown';

describe('renderMarkdown', () => {
  it('renders the Markdown a note is written in', () => {
    const html = renderMarkdown('## Why M 0.80\n\nTamsk asked for the **faster** cruise.\n\n| Re | x/c |\n|---|---|\n| 2e7 | 0.41 |');
    expect(html).toContain('<h2>Why M 0.80</h2>');
    expect(html).toContain('<strong>faster</strong>');
    expect(html).toContain('<td>0.41</td>');
  });

  it('shows raw HTML as text and carries no script, handler or script link', () => {
    const html = renderMarkdown('<img src=x onerror="alert(1)"> <script>alert(2)</script>\n\n[tunnel log](javascript:alert(3))');
    const doc = new DOMParser().parseFromString(html, 'text/html');
    expect(doc.querySelectorAll('img, script')).toHaveLength(0);
    const handlers = Array.from(doc.querySelectorAll('*')).flatMap((el) => Array.from(el.attributes).map((a) => a.name)).filter((name) => name.startsWith('on'));
    expect(handlers).toEqual([]);
    expect(Array.from(doc.querySelectorAll('a')).map((a) => a.getAttribute('href') ?? '')).not.toContainEqual(expect.stringMatching(/^javascript:/i));
    // What was typed stays readable as text.
    expect(doc.body.textContent).toContain('<img src=x onerror="alert(1)">');
    expect(doc.body.textContent).toContain('tunnel log');
  });
});
