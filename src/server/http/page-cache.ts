/**
 * A short-lived, in-process cache of listing pages as anonymous visitors get them.
 *
 * Rendering a listing page costs several milliseconds of CPU (three queries, the description's Markdown, the fit
 * check and the measurement plots rendered on the server and their props serialized), and everyone who is not
 * signed in gets the same HTML. Only a GET of /listings/<id> without a query string and without a session cookie
 * is served from here, and only a 200 HTML answer that sets no cookie is kept, so nothing a signed-in visitor sees
 * (cart, questions, the lab's edit link, a working copy) is ever stored. An entry is dropped at once when the
 * listing changes in this process (edits, moderation, stock taken or released by checkout) and lives TTL_MS at
 * most, which bounds how stale another instance's copy can be.
 */
import { onListingChanged } from '../listings/events';

const TTL_MS = 5_000;
const MAX_ENTRIES = 500;
const LISTING_PAGE = /^\/listings\/[^/]+$/;

interface Entry {
  /** Encoded once: a hit then costs no UTF-8 encoding of the page. */
  body: ArrayBuffer;
  status: number;
  headers: [string, string][];
  expires: number;
}

const entries = new Map<string, Entry>();
/** Renders under way: when an entry expires under load, the requests that miss wait for one render, not one each. */
const rendering = new Map<string, Promise<Entry | null>>();

onListingChanged((id) => entries.delete(`/listings/${id}`));

/** The cache key for a request that may be answered from the cache, else null. */
export function pageCacheKey(request: Request, url: URL, hasSession: boolean): string | null {
  if (request.method !== 'GET' || hasSession || url.search !== '' || !LISTING_PAGE.test(url.pathname)) return null;
  return url.pathname;
}

const answer = (e: Entry) => new Response(e.body, { status: e.status, headers: e.headers });

/** Answers from the cache, or renders and keeps a cacheable answer. */
export async function cachedPage(key: string, render: () => Promise<Response>, now = Date.now): Promise<Response> {
  const hit = entries.get(key);
  if (hit && hit.expires > now()) return answer(hit);
  const under = rendering.get(key);
  if (under) {
    const entry = await under;
    return entry ? answer(entry) : render();
  }
  let settle: (e: Entry | null) => void = () => {};
  rendering.set(key, new Promise((resolve) => (settle = resolve)));
  let entry: Entry | null = null;
  try {
    const response = await render();
    if (response.status !== 200 || !/^text\/html\b/i.test(response.headers.get('content-type') ?? '') || response.headers.has('set-cookie'))
      return response;
    entry = { body: await response.arrayBuffer(), status: response.status, headers: [...response.headers], expires: now() + TTL_MS };
    entries.delete(key);
    if (entries.size >= MAX_ENTRIES) entries.delete(entries.keys().next().value!);
    entries.set(key, entry);
    return answer(entry);
  } finally {
    rendering.delete(key);
    settle(entry);
  }
}
