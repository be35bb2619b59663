import { finishAuthentication, payCheckoutSession, type CheckoutSession, type PaymentAttempt } from '../checkout';
import type { StripeFakeContext } from '../context';
import { invalidRequest, missingParam, resourceMissing } from '../errors';
import type { FakeRequest, Router } from '../router';

type JsonObject = Record<string, unknown>;

function isJsonObject(value: unknown): value is JsonObject {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function jsonBody(request: FakeRequest): JsonObject {
  let parsed: unknown;
  try {
    parsed = JSON.parse(request.rawBody || '{}');
  } catch {
    throw invalidRequest('Invalid JSON body');
  }
  if (!isJsonObject(parsed)) throw invalidRequest('The JSON body must be an object');
  return parsed;
}

function optional<T>(body: JsonObject, name: string, type: 'string' | 'number' | 'boolean'): T | undefined {
  const value = body[name];
  if (value === undefined || value === null) return undefined;
  if (typeof value !== type) throw invalidRequest(`Invalid ${type}`, { param: name });
  return value as T;
}

/**
 * Pays a session as the hosted page would: `card` alone is one attempt, which for the card that
 * needs confirmation stops at the authentication step; `authenticate` answers that step, in the
 * same call or (without `card`) for an attempt made earlier.
 */
function paySession(request: FakeRequest, context: StripeFakeContext): CheckoutSession {
  const body = jsonBody(request);
  const id = request.params.id ?? '';
  const session = context.state.get<CheckoutSession>('checkout.session', id);
  if (!session) throw resourceMissing('checkout.session', id);
  const card = optional<string>(body, 'card', 'string');
  const authenticate = optional<boolean>(body, 'authenticate', 'boolean');
  if (card === undefined) {
    if (authenticate === undefined) throw missingParam('card');
    return finishAuthentication(context, session, authenticate).session;
  }
  const attempt: PaymentAttempt = payCheckoutSession(context, session, {
    number: card,
    expMonth: optional<number>(body, 'exp_month', 'number'),
    expYear: optional<number>(body, 'exp_year', 'number'),
    cvc: optional<string>(body, 'cvc', 'string'),
    name: optional<string>(body, 'name', 'string'),
    email: optional<string>(body, 'email', 'string'),
  });
  if (attempt.outcome === 'requires_action' && authenticate !== undefined)
    return finishAuthentication(context, session, authenticate).session;
  return attempt.session;
}

/**
 * Routes that exist only on the fake, under /_fake/, for tests and local development: they stand
 * in for what happens on the provider's side without an API call. They take JSON and need no key.
 */
export function addFakeControlRoutes(router: Router<StripeFakeContext>): void {
  // Sends an arbitrary event through the webhook pipeline, like `stripe trigger` does.
  router.post('/_fake/events', (request, { events }) => {
    const { type, object, previous_attributes: previousAttributes, account } = jsonBody(request);
    if (typeof type !== 'string' || type === '') {
      throw invalidRequest('Missing required param: type.', { code: 'parameter_missing', param: 'type' });
    }
    if (!isJsonObject(object)) {
      throw invalidRequest('Missing required param: object.', { code: 'parameter_missing', param: 'object' });
    }
    if (previousAttributes !== undefined && !isJsonObject(previousAttributes)) {
      throw invalidRequest('Invalid hash', { param: 'previous_attributes' });
    }
    if (account !== undefined && (typeof account !== 'string' || !account.startsWith('acct_'))) {
      throw invalidRequest('Invalid account: expected an acct_ id', { param: 'account' });
    }
    return events.emit(type, object, { previousAttributes, account });
  });

  router.post('/_fake/checkout/sessions/:id/pay', paySession);
}
