import type { APIContext, MiddlewareNext } from 'astro';
import { defineMiddleware } from 'astro:middleware';
import { readSession, SESSION_COOKIE } from './server/auth/session';
import { loadCurrentUser } from './server/auth/users';
import { ensureRuntime } from './server/runtime';
import { errorBody, jsonResponse } from './server/http/errors';
import { cachedPage, pageCacheKey } from './server/http/page-cache';
import { withSecurityHeaders } from './server/http/security-headers';

/**
 * Validates the session cookie and fills Astro.locals; authorization is the guards' job. Besides that:
 * - the router answers a known /api path called with a method it lacks by an empty 404 (then an HTML page); under /api
 *   that becomes JSON (401 without a session, else 405) so the API never answers HTML;
 * - listing pages for visitors without a session come from a short-lived cache (server/http/page-cache.ts);
 * - every answer gets the security headers (CSP, nosniff, Referrer-Policy, Permissions-Policy, HSTS on https), all
 *   decided in server/http/security-headers.ts. Astro's origin check runs before this middleware, so its 403 for a
 *   cross-site form post is Astro's plain text without them.
 */
export const onRequest = defineMiddleware(async (context, next) => withSecurityHeaders(await respond(context, next)));

async function respond({ cookies, locals, isPrerendered, request, url }: APIContext, next: MiddlewareNext): Promise<Response> {
  locals.user = null;
  locals.session = null;
  if (isPrerendered) return next();
  await ensureRuntime();
  const session = await readSession(cookies);
  if (session) {
    const user = await loadCurrentUser(session.userId);
    if (user) {
      locals.session = session;
      locals.user = user;
    }
  }
  const cacheKey = pageCacheKey(request, url, cookies.has(SESSION_COOKIE));
  const response = cacheKey ? await cachedPage(cacheKey, next) : await next();
  if (url.pathname.startsWith('/api/') && response.status === 404 && response.body === null) {
    return locals.user || isPublicApi(url.pathname)
      ? jsonResponse(errorBody('method_not_allowed', 'This route does not accept that method.'), 405)
      : jsonResponse(errorBody('unauthenticated', 'Sign in to continue.'), 401);
  }
  // A path still percent-encoded after decoding (…%20…%3D…) matches no route at all: Astro renders the HTML 404
  // page, with `url` rebuilt from the decoded path (where an encoded `..\` climbs out of /api). Judged by the path
  // the client sent, it answers like an unknown API path instead.
  if (
    new URL(request.url).pathname.startsWith('/api/') &&
    response.status === 404 &&
    !response.headers.get('content-type')?.startsWith('application/json')
  ) {
    return locals.user
      ? jsonResponse(errorBody('not_found', 'No such API route.'), 404)
      : jsonResponse(errorBody('unauthenticated', 'Sign in to continue.'), 401);
  }
  return response;
}

const PUBLIC_API = ['/api/auth/', '/api/fit/', '/api/webhooks/', '/api/search', '/api/saved-searches/unsubscribe'];
function isPublicApi(path: string): boolean {
  return PUBLIC_API.some((p) => path.startsWith(p));
}
