import type { ServerResponse } from 'node:http';

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Text and attribute values put into a page: everything the API caller chose passes through here. */
function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (character) => ESCAPES[character] ?? character);
}

/** Builds a page fragment in which every interpolated value is escaped, unless it is already `Html`. */
export class Html {
  constructor(readonly value: string) {}
  toString(): string {
    return this.value;
  }
}

export function html(
  strings: TemplateStringsArray,
  ...values: ReadonlyArray<Html | string | number | null | undefined | ReadonlyArray<Html>>
): Html {
  let out = strings[0] ?? '';
  values.forEach((value, index) => {
    if (Array.isArray(value)) out += value.map(String).join('');
    else if (value instanceof Html) out += value.value;
    else if (value !== null && value !== undefined) out += escapeHtml(String(value));
    out += strings[index + 1] ?? '';
  });
  return new Html(out);
}

// One plain style for every page the fake serves: no fonts, scripts or images from anywhere.
const STYLE = `
  :root { color-scheme: light; --ink: #1f2a30; --muted: #5d6b73; --line: #d5dadd; --accent: #1d6f5f; --warn: #9a3412; }
  * { box-sizing: border-box; }
  body { margin: 0; font: 16px/1.5 system-ui, sans-serif; color: var(--ink); background: #eef1f0; }
  .strip { background: repeating-linear-gradient(135deg, #f6d860 0 14px, #1f2a30 14px 28px); height: 8px; }
  main { max-width: 30rem; margin: 2.5rem auto; padding: 0 1rem; }
  .panel { background: #fff; border: 1px solid var(--line); border-radius: 6px; padding: 1.5rem; }
  .badge { display: inline-block; font-size: .75rem; letter-spacing: .06em; text-transform: uppercase; color: var(--muted); border: 1px dashed var(--muted); border-radius: 3px; padding: 0 .4rem; }
  h1 { font-size: 1.35rem; margin: .6rem 0 1rem; }
  table { width: 100%; border-collapse: collapse; margin-bottom: 1rem; }
  td { padding: .35rem 0; border-bottom: 1px solid var(--line); vertical-align: top; }
  td.amount { text-align: right; white-space: nowrap; padding-left: 1rem; }
  tr.total td { font-weight: 600; border-bottom: 0; }
  label { display: block; font-size: .875rem; color: var(--muted); margin: .75rem 0 .2rem; }
  input { width: 100%; font: inherit; padding: .5rem .6rem; border: 1px solid var(--line); border-radius: 4px; }
  .row { display: flex; gap: .75rem; } .row > div { flex: 1; }
  button { font: inherit; font-weight: 600; width: 100%; margin-top: 1.25rem; padding: .65rem; border: 0; border-radius: 4px; background: var(--accent); color: #fff; cursor: pointer; }
  button.secondary { background: #fff; color: var(--warn); border: 1px solid var(--warn); margin-top: .6rem; }
  .error { border-left: 4px solid var(--warn); background: #fff4ed; padding: .6rem .8rem; margin-bottom: 1rem; }
  .note { font-size: .85rem; color: var(--muted); }
  .note code { font-size: .8rem; }
  a { color: var(--accent); }
`;

export function page(title: string, body: Html): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="icon" href="data:,">
<title>${escapeHtml(title)}</title>
<style>${STYLE}</style>
</head>
<body>
<div class="strip"></div>
<main>
<div class="panel">
<span class="badge">Payments fake · test mode · no real money</span>
${body.value}
</div>
</main>
</body>
</html>
`;
}

const PAGE_HEADERS = {
  'Content-Type': 'text/html; charset=utf-8',
  'Cache-Control': 'no-store',
  // Inline style only; form-action is left open because a form may end in a redirect to the app.
  'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; frame-ancestors 'none'",
  'Referrer-Policy': 'no-referrer',
  'X-Content-Type-Options': 'nosniff',
};

export function sendPage(response: ServerResponse, status: number, title: string, body: Html): void {
  const payload = page(title, body);
  response.writeHead(status, { ...PAGE_HEADERS, 'Content-Length': Buffer.byteLength(payload) });
  response.end(payload);
}

/** 303, so that the browser follows a form POST with a GET. */
export function redirect(response: ServerResponse, location: string): void {
  response.writeHead(303, { Location: location, 'Cache-Control': 'no-store', 'Content-Length': 0 });
  response.end();
}
