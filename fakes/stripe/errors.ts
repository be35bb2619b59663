/** The `error` member of the provider's error responses. */
export interface StripeErrorBody {
  type: 'invalid_request_error' | 'idempotency_error' | 'api_error' | 'card_error';
  message: string;
  code?: string;
  param?: string;
  doc_url?: string;
  /** Card errors: the issuer's reason, and the charge the attempt left behind. */
  decline_code?: string;
  charge?: string;
}

/** Thrown by any part of the fake; the server turns it into `{ error }` with `status`. */
export class StripeFakeError extends Error {
  constructor(
    readonly status: number,
    readonly body: StripeErrorBody,
  ) {
    super(body.message);
    this.name = 'StripeFakeError';
  }
}

const SUPPORT = 'Please see https://stripe.com/docs or we can help at https://support.stripe.com/.';

function withDocUrl(body: StripeErrorBody): StripeErrorBody {
  if (!body.code) return body;
  return { ...body, doc_url: `https://stripe.com/docs/error-codes/${body.code.replace(/_/g, '-')}` };
}

export function invalidRequest(
  message: string,
  { status = 400, code, param }: { status?: number; code?: string; param?: string } = {},
): StripeFakeError {
  const body: StripeErrorBody = { type: 'invalid_request_error', message };
  if (code) body.code = code;
  if (param) body.param = param;
  return new StripeFakeError(status, withDocUrl(body));
}

/**
 * `noun` as the provider names objects in this message: `customer`, `checkout.session`. An id in
 * the path is a 404; an id given as a parameter (`payment_intent=pi_…`) is a 400.
 */
export function resourceMissing(noun: string, id: string, param = 'id', status = 404): StripeFakeError {
  return invalidRequest(`No such ${noun}: '${id}'`, { status, code: 'resource_missing', param });
}

export function missingParam(param: string): StripeFakeError {
  return invalidRequest(`Missing required param: ${param}.`, { code: 'parameter_missing', param });
}

export function unknownParam(param: string): StripeFakeError {
  return invalidRequest(`Received unknown parameter: ${param}`, { code: 'parameter_unknown', param });
}

/** A 402 `card_error`, which the SDK raises as StripeCardError. */
export function cardError(body: Omit<StripeErrorBody, 'type'> & { code: string }): StripeFakeError {
  return new StripeFakeError(402, withDocUrl({ type: 'card_error', ...body }));
}

export function unrecognizedUrl(method: string, path: string): StripeFakeError {
  return invalidRequest(`Unrecognized request URL (${method}: ${path}). ${SUPPORT}`, {
    status: 404,
    code: 'resource_missing',
  });
}

export function missingApiKey(): StripeFakeError {
  return invalidRequest(
    "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY'). See https://stripe.com/docs/api#authentication for details, or we can help at https://support.stripe.com/.",
    { status: 401 },
  );
}

function maskKey(key: string): string {
  return key.length > 12 ? `${key.slice(0, 8)}${'*'.repeat(key.length - 12)}${key.slice(-4)}` : key;
}

export function invalidApiKey(key: string): StripeFakeError {
  return invalidRequest(`Invalid API Key provided: ${maskKey(key)}`, { status: 401 });
}

/** A `Stripe-Account` header naming an account the key cannot act for: the SDK's StripePermissionError. */
export function accountNotAccessible(key: string, account: string): StripeFakeError {
  return invalidRequest(
    `The provided key '${maskKey(key)}' does not have access to account '${account}' (or that account does not exist). Application access may have been revoked.`,
    { status: 403 },
  );
}

function idempotencyError(status: number, message: string): StripeFakeError {
  return new StripeFakeError(status, { type: 'idempotency_error', message });
}

export function idempotencyParametersMismatch(key: string): StripeFakeError {
  return idempotencyError(
    400,
    `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
  );
}

export function idempotencyEndpointMismatch(key: string, first: string, now: string): StripeFakeError {
  return idempotencyError(
    400,
    `Keys for idempotent requests can only be used for the same endpoint they were first used for ('${first}' vs '${now}'). Try using a key other than '${key}' if you meant to execute a different request.`,
  );
}

export function idempotencyInProgress(key: string): StripeFakeError {
  return idempotencyError(
    409,
    `There is currently another in-progress request using this Idempotent Key (that probably means you submitted twice, and the other request is still going through): ${key}. Please try again later.`,
  );
}

export function unexpectedFailure(): StripeFakeError {
  return new StripeFakeError(500, {
    type: 'api_error',
    message: 'An unknown error occurred while processing the request in the payments fake.',
  });
}
