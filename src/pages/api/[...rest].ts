import type { APIRoute } from 'astro';
import { requireUser } from '../../server/auth/guards';
import { endpoint } from '../../server/http/endpoint';
import { notFound } from '../../server/http/errors';

/** Unknown API paths answer JSON, never an HTML page: 401 without a session, else 404. */
const unknown = endpoint(async (ctx) => {
  requireUser(ctx);
  throw notFound(`No API route ${ctx.request.method} ${ctx.url.pathname}.`);
});

export const ALL: APIRoute = unknown;
