import type { IncomingHttpHeaders, IncomingMessage } from 'node:http';
import { requireTestModeKey } from './auth';
import type { StripeFakeContext } from './context';
import { accountNotAccessible, resourceMissing, StripeFakeError, unexpectedFailure, unrecognizedUrl } from './errors';
import { expandPaths, expandResponse, type VirtualField } from './expand';
import { parseFormBody } from './form-body';
import type { IdempotencyKeys } from './idempotency';
import { newId } from './ids';
import type { FakeRequest, RouteHandler, RouteMatch, Router } from './router';
import type { StoredResponse } from './state';

export interface Reply {
  response: StoredResponse;
  headers: Record<string, string>;
}

const CONTROL_PREFIX = '/_fake/';
// `/v1/<collection>/<id>` with an optional action (`/v1/payment_intents/pi_123/confirm`).
const OBJECT_PATH = /^\/v1\/((?:[a-z_]+\/)*?[a-z_]+)\/([a-z]+_[A-Za-z0-9_]+)(?:\/[a-z_]+)?$/;

/**
 * For a path shaped like `/v1/customers/cus_123` the provider says which object is missing
 * ("No such customer: 'cus_123'"), even for types this fake does not implement yet.
 */
function noRoute(method: string, path: string): StripeFakeError {
  const match = OBJECT_PATH.exec(path);
  if (!match) return unrecognizedUrl(method, path);
  const [, collection = '', id = ''] = match;
  const noun = collection
    .split('/')
    .map((segment, index, all) => (index === all.length - 1 ? segment.replace(/s$/, '') : segment))
    .join('.');
  return resourceMissing(noun, id);
}

function headerValue(headers: IncomingHttpHeaders, name: string): string | undefined {
  const value = headers[name];
  return Array.isArray(value) ? value[0] : value;
}

export async function readBody(request: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of request) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString('utf8');
}

export function newRequestId(): string {
  return newId('req', 14);
}

export function errorResponse(error: unknown, requestId: string): StoredResponse {
  if (!(error instanceof StripeFakeError)) console.error('payments fake: request failed', error);
  const known = error instanceof StripeFakeError ? error : unexpectedFailure();
  return { status: known.status, body: { error: known.body }, requestId };
}

/** The connected account a request acts for: '' without `Stripe-Account`, a 403 for one that does not exist. */
function actingAccount(headers: IncomingHttpHeaders, key: string | undefined, context: StripeFakeContext): string {
  const account = headerValue(headers, 'stripe-account')?.trim() ?? '';
  if (account === '' || key === undefined) return account;
  if (!context.state.get('account', account)) throw accountNotAccessible(key, account);
  return account;
}

/**
 * The path of every request: API key (except on /_fake/ routes), route, form decoding,
 * Idempotency-Key, handler, and the provider's error shape for anything thrown on the way.
 */
export function createRequestHandler(
  router: Router<StripeFakeContext>,
  context: StripeFakeContext,
  idempotency: IdempotencyKeys,
  apiVersion: string,
  virtualFields: Record<string, VirtualField>,
): (request: IncomingMessage) => Promise<Reply> {
  /**
   * The body is a copy, expanded as `expand[]` asks: a stored object changes later, while the
   * response (and its idempotent replay) must stay as it was.
   */
  async function run(handler: RouteHandler<StripeFakeContext>, request: FakeRequest): Promise<StoredResponse> {
    const body: unknown = structuredClone(await handler(request, context));
    expandResponse(body, expandPaths(request.query, request.body), { state: context.state, account: request.account, virtualFields });
    return { status: 200, body, requestId: request.requestId };
  }

  async function runIdempotent(match: RouteMatch<StripeFakeContext>, request: FakeRequest, key: string): Promise<Reply> {
    const outcome = idempotency.begin({
      account: request.account,
      key,
      path: request.path,
      rawBody: request.rawBody,
    });
    const headers = { 'Idempotency-Key': key };
    if (outcome.kind === 'replay') {
      return { response: outcome.response, headers: { ...headers, 'Idempotent-Replayed': 'true' } };
    }
    try {
      const response = await run(match.handler, request);
      outcome.finish(response);
      return { response, headers };
    } catch (error) {
      // A declined card (402) is an outcome the provider replays; other failures are not kept.
      if (error instanceof StripeFakeError && error.status === 402) {
        const response = errorResponse(error, request.requestId);
        outcome.finish(response);
        return { response, headers };
      }
      outcome.abandon();
      throw error;
    }
  }

  return async (incoming) => {
    const requestId = newRequestId();
    const method = incoming.method ?? 'GET';
    const url = new URL(incoming.url ?? '/', 'http://fake.invalid');
    const rawBody = await readBody(incoming);
    const headers = { 'Stripe-Version': headerValue(incoming.headers, 'stripe-version') ?? apiVersion };
    const idempotencyKey = method === 'POST' ? headerValue(incoming.headers, 'idempotency-key') : undefined;

    try {
      const key = url.pathname.startsWith(CONTROL_PREFIX) ? undefined : requireTestModeKey(headerValue(incoming.headers, 'authorization'));
      const match = router.match(method, url.pathname);
      if (!match) throw noRoute(method, url.pathname);
      const isJson = headerValue(incoming.headers, 'content-type')?.startsWith('application/json') ?? false;
      const request: FakeRequest = {
        method,
        path: url.pathname,
        params: match.params,
        query: parseFormBody(url.search.slice(1)),
        body: isJson ? {} : parseFormBody(rawBody),
        rawBody,
        headers: incoming.headers,
        requestId,
        idempotencyKey: idempotencyKey ?? null,
        account: actingAccount(incoming.headers, key, context),
      };
      if (!idempotencyKey) return { response: await run(match.handler, request), headers };
      const reply = await runIdempotent(match, request, idempotencyKey);
      return { response: reply.response, headers: { ...headers, ...reply.headers } };
    } catch (error) {
      return { response: errorResponse(error, requestId), headers };
    } finally {
      if (method !== 'GET') context.state.save();
    }
  };
}
