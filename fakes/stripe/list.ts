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

const RANGE_KEYS = ['gt', 'gte', 'lt', 'lte'] as const;

function integerParam(value: string, param: string): number {
  if (!/^-?\d+$/.test(value)) throw invalidRequest(`Invalid integer: ${value}`, { code: 'parameter_invalid_integer', param });
  return Number(value);
}

/**
 * A timestamp filter such as `created`, given either as one value (`created=1700000000`) or as a
 * range (`created[gte]=…&created[lt]=…`), as a predicate on the objects' field of that name.
 */
export function rangeFilter(query: FormObject, name: string): (item: StripeObject) => boolean {
  const value = query[name];
  if (value === undefined || value === '') return () => true;
  if (typeof value === 'string') {
    const exact = integerParam(value, name);
    return (item) => item[name] === exact;
  }
  if (Array.isArray(value)) throw invalidRequest('Invalid hash', { param: name });
  const bounds: Partial<Record<(typeof RANGE_KEYS)[number], number>> = {};
  for (const [key, bound] of Object.entries(value)) {
    const param = `${name}[${key}]`;
    if (!(RANGE_KEYS as readonly string[]).includes(key)) {
      throw invalidRequest(`Received unknown parameter: ${param}`, { code: 'parameter_unknown', param });
    }
    if (typeof bound !== 'string') throw invalidRequest('Invalid integer', { param });
    bounds[key as (typeof RANGE_KEYS)[number]] = integerParam(bound, param);
  }
  return (item) => {
    const field = item[name];
    if (typeof field !== 'number') return false;
    const { gt, gte, lt, lte } = bounds;
    return (
      (gt === undefined || field > gt) &&
      (gte === undefined || field >= gte) &&
      (lt === undefined || field < lt) &&
      (lte === undefined || field <= lte)
    );
  };
}

/** An exact-match filter on a string field (`status=open`, `payment_intent=pi_…`). */
export function fieldFilter(query: FormObject, name: string, field = name): (item: StripeObject) => boolean {
  const wanted = stringParam(query, name);
  return (item) => wanted === undefined || item[field] === wanted;
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
export function paginate<T extends StripeObject>(items: T[], query: FormObject, url: string, noun: string): ListObject<T> {
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
