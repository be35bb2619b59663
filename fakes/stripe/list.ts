import { invalidRequest, resourceMissing } from './errors';
import type { FormObject } from './form-body';
import type { StripeObject } from './state';

export interface ListObject<T> {
  object: 'list';
  data: T[];
  has_more: boolean;
  url: string;
}

const DEFAULT_LIMIT = 10;
const MAX_LIMIT = 100;

function stringParam(query: FormObject, name: string): string | undefined {
  const value = query[name];
  if (value === undefined || value === '') return undefined;
  if (typeof value !== 'string') throw invalidRequest('Invalid string', { param: name });
  return value;
}

function limitParam(query: FormObject): number {
  const raw = stringParam(query, 'limit');
  if (raw === undefined) return DEFAULT_LIMIT;
  const limit = Number(raw);
  if (!Number.isInteger(limit) || limit < 1 || limit > MAX_LIMIT) {
    throw invalidRequest(`Invalid limit: must be an integer between 1 and ${MAX_LIMIT}`, {
      code: 'parameter_invalid_integer',
      param: 'limit',
    });
  }
  return limit;
}

function cursorIndex<T extends StripeObject>(items: T[], id: string, noun: string, param: string): number {
  const index = items.findIndex((item) => item.id === id);
  if (index === -1) throw resourceMissing(noun, id, param);
  return index;
}

/**
 * One page of a list endpoint, with the provider's cursor parameters (`limit`, `starting_after`,
 * `ending_before`). `items` must be newest first; `noun` names them in a bad cursor's error.
 */
export function paginate<T extends StripeObject>(
  items: T[],
  query: FormObject,
  url: string,
  noun: string,
): ListObject<T> {
  const limit = limitParam(query);
  const startingAfter = stringParam(query, 'starting_after');
  const endingBefore = stringParam(query, 'ending_before');
  if (startingAfter && endingBefore) {
    throw invalidRequest('You may only specify one of these parameters: starting_after, ending_before.', {
      code: 'parameters_exclusive',
      param: 'ending_before',
    });
  }

  if (endingBefore) {
    const end = cursorIndex(items, endingBefore, noun, 'ending_before');
    const start = Math.max(0, end - limit);
    return { object: 'list', data: items.slice(start, end), has_more: start > 0, url };
  }
  const start = startingAfter ? cursorIndex(items, startingAfter, noun, 'starting_after') + 1 : 0;
  return {
    object: 'list',
    data: items.slice(start, start + limit),
    has_more: start + limit < items.length,
    url,
  };
}
