import { describe, expect, test } from 'vitest';
import { renderMarkdown } from '../../../src/server/listings/markdown';

describe('listing descriptions render Markdown safely', () => {
  test('formatting survives', () => {
    const html = renderMarkdown('**Supermirror** pair\n\n- ROC 50 mm\n- [datasheet](https://lab.example/ds.pdf)');
    expect(html).toContain('<strong>Supermirror</strong>');
    expect(html).toContain('<li>ROC 50 mm</li>');
    expect(html).toMatch(/<a href="https:\/\/lab\.example\/ds\.pdf"[^>]*rel="nofollow noopener noreferrer"/);
  });

  test('scripts, event handlers, javascript: links and raw HTML are removed', () => {
    const html = renderMarkdown(
      '<script>alert(1)</script><img src=x onerror=alert(2)>[x](javascript:alert(3))<iframe src="https://evil.example"></iframe><b onclick="alert(4)">bold</b>',
    );
    expect(html).not.toMatch(/<script|onerror|href="javascript:|<iframe|onclick|<img/i);
    expect(renderMarkdown('[x](javascript:alert(3))')).not.toMatch(/href="javascript:/i);
  });
});
