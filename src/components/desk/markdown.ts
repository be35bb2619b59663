// The description as the preview shows it, matching what the listing page renders from Markdown:
// raw HTML and images are dropped (their text stays), only http(s) and mailto links stay links, and
// headings step down two levels under the listing's own.
import { Marked } from 'marked';

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ESCAPES[c] as string);

const SAFE_LINK = /^(https?:|mailto:)/i;

const markdown = new Marked({
  gfm: true,
  breaks: true,
  async: false,
  renderer: {
    html() {
      return '';
    },
    image({ text }) {
      return escapeHtml(text);
    },
    heading({ tokens, depth }) {
      const inner = this.parser.parseInline(tokens);
      return depth <= 2 ? `<h${depth + 2}>${inner}</h${depth + 2}>` : `<p>${inner}</p>`;
    },
    link({ href, tokens }) {
      const inner = this.parser.parseInline(tokens);
      return SAFE_LINK.test(href) ? `<a href="${escapeHtml(href)}" rel="nofollow noopener noreferrer" target="_blank">${inner}</a>` : inner;
    },
  },
});

export function renderDescription(text: string): string {
  return markdown.parse(text, { async: false });
}
