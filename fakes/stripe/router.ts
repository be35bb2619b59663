import type { IncomingHttpHeaders } from 'node:http';
import type { FormObject } from './form-body';

export interface FakeRequest {
  method: string;
  path: string;
  params: Record<string, string>;
  /** Query string, decoded like a form body (`expand[0]=...`, `created[gte]=...`). */
  query: FormObject;
  /** Form-encoded body as the SDK sends it; empty for JSON bodies, which stay in `rawBody`. */
  body: FormObject;
  rawBody: string;
  headers: IncomingHttpHeaders;
  requestId: string;
  idempotencyKey: string | null;
  /** The connected account named by `Stripe-Account`, checked to exist; '' for the platform. */
  account: string;
}

/** Returns the JSON body of a 200 response; failures are thrown as StripeFakeError. */
export type RouteHandler<Context> = (request: FakeRequest, context: Context) => unknown;

interface Route<Context> {
  method: string;
  segments: string[];
  handler: RouteHandler<Context>;
}

export interface RouteMatch<Context> {
  handler: RouteHandler<Context>;
  params: Record<string, string>;
}

function splitPath(path: string): string[] {
  return path.split('/').filter((segment) => segment !== '');
}

function decodeSegment(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    // A malformed escape is kept as sent; the lookup then fails with the usual "No such ..." error.
    return segment;
  }
}

/** Method and path patterns such as `/v1/checkout/sessions/:id/expire`. */
export class Router<Context> {
  private readonly routes: Route<Context>[] = [];

  get(pattern: string, handler: RouteHandler<Context>): this {
    return this.add('GET', pattern, handler);
  }

  post(pattern: string, handler: RouteHandler<Context>): this {
    return this.add('POST', pattern, handler);
  }

  match(method: string, path: string): RouteMatch<Context> | undefined {
    const segments = splitPath(path);
    for (const route of this.routes) {
      if (route.method !== method || route.segments.length !== segments.length) continue;
      const params: Record<string, string> = {};
      const matches = route.segments.every((expected, index) => {
        const actual = segments[index] ?? '';
        if (!expected.startsWith(':')) return expected === actual;
        params[expected.slice(1)] = decodeSegment(actual);
        return true;
      });
      if (matches) return { handler: route.handler, params };
    }
    return undefined;
  }

  private add(method: string, pattern: string, handler: RouteHandler<Context>): this {
    this.routes.push({ method, segments: splitPath(pattern), handler });
    return this;
  }
}
