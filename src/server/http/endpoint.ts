import type { APIContext, APIRoute } from 'astro';
import { errorResponse, HttpError, jsonResponse } from './errors';

/**
 * Wraps an endpoint so that every failure answers the JSON error shape: thrown HttpErrors keep their
 * status; anything else is logged and answers a plain 500 with no detail (no stack or SQL leaks out).
 */
export function endpoint(handler: (ctx: APIContext) => Promise<Response | unknown>): APIRoute {
  return async (ctx) => {
    try {
      const result = await handler(ctx);
      return result instanceof Response ? result : jsonResponse(result);
    } catch (err) {
      if (err instanceof HttpError) return errorResponse(err);
      if (isBusy(err)) {
        return errorResponse(
          new HttpError(503, 'unavailable', 'The service is busy. Try again in a moment.', undefined, { 'retry-after': '2' }),
        );
      }
      console.error(`[${ctx.request.method} ${ctx.url.pathname}]`, err);
      return errorResponse(new HttpError(500, 'internal', 'Something went wrong on our side. Please try again.'));
    }
  };
}

/** Drizzle wraps the driver's error (DrizzleQueryError), so the busy code may sit further down the cause chain. */
function isBusy(err: unknown): boolean {
  for (let e = err, depth = 0; e && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const text = String((e as { code?: string }).code ?? '') + String((e as Error).message ?? '');
    if (/SQLITE_BUSY|database is locked/i.test(text)) return true;
  }
  return false;
}
