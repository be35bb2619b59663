// The description as the preview shows it: Markdown without HTML. Raw HTML is shown as typed
// (escaped), images as their alt text, and only http(s) and mailto links become links.
import { Marked } from 'marked';

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ESCAPES[c] as string);

const SAFE_LINK = /^(https?:|mailto:)/i;

const markdown = new Marked({
  gfm: true,
  async: false,
  renderer: {
    html({ text }) {
      return escapeHtml(text);
    },
    image({ text }) {
      return escapeHtml(text);
    },
    link({ href, tokens }) {
      const inner = this.parser.parseInline(tokens);
      return SAFE_LINK.test(href) ? `<a href="${escapeHtml(href)}" rel="nofollow noopener noreferrer">${inner}</a>` : inner;
    },
  },
});

export function renderDescription(text: string): string {
  return markdown.parse(text, { async: false });
}
