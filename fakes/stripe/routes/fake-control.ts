import type { StripeFakeContext } from '../context';
import { invalidRequest } from '../errors';
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

/**
 * Routes that exist only on the fake, under /_fake/, for tests and local development: they stand
 * in for what happens on the provider's side without an API call. They take JSON and need no key.
 */
export function addFakeControlRoutes(router: Router<StripeFakeContext>): void {
  // Sends an arbitrary event through the webhook pipeline, like `stripe trigger` does.
  router.post('/_fake/events', (request, { events }) => {
    const { type, object, previous_attributes: previousAttributes } = jsonBody(request);
    if (typeof type !== 'string' || type === '') {
      throw invalidRequest('Missing required param: type.', { code: 'parameter_missing', param: 'type' });
    }
    if (!isJsonObject(object)) {
      throw invalidRequest('Missing required param: object.', { code: 'parameter_missing', param: 'object' });
    }
    if (previousAttributes !== undefined && !isJsonObject(previousAttributes)) {
      throw invalidRequest('Invalid hash', { param: 'previous_attributes' });
    }
    return events.emit(type, object, { previousAttributes });
  });
}
