import { defineMiddleware } from 'astro:middleware';
import { readSession } from './server/auth/session';
import { loadCurrentUser } from './server/auth/users';
import { ensureRuntime } from './server/runtime';
import { errorBody, jsonResponse } from './server/http/errors';

/**
 * Validates the session cookie and fills Astro.locals; authorization is the guards' job.
 * One more duty: the router answers a known /api path called with a method it lacks by an empty 404 (then an HTML page);
 * under /api that becomes JSON (401 without a session, else 405) so the API never answers HTML.
 */
export const onRequest = defineMiddleware(async ({ cookies, locals, isPrerendered, url }, next) => {
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
  const response = await next();
  if (url.pathname.startsWith('/api/') && response.status === 404 && response.body === null) {
    return locals.user || isPublicApi(url.pathname)
      ? jsonResponse(errorBody('method_not_allowed', 'This route does not accept that method.'), 405)
      : jsonResponse(errorBody('unauthenticated', 'Sign in to continue.'), 401);
  }
  return response;
});

const PUBLIC_API = ['/api/auth/', '/api/fit/', '/api/webhooks/'];
function isPublicApi(path: string): boolean {
  return PUBLIC_API.some((p) => path.startsWith(p));
}
