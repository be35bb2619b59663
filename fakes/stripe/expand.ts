import { invalidRequest } from './errors';
import type { FormObject } from './form-body';
import type { StateStore, StripeObject } from './state';

// Which stored type an id names, by its prefix; `cs_test_` sessions share `cs_`.
const TYPES_BY_PREFIX: ReadonlyArray<readonly [string, string]> = [
  ['cs_', 'checkout.session'],
  ['pi_', 'payment_intent'],
  ['ch_', 'charge'],
  ['pm_', 'payment_method'],
  ['re_', 'refund'],
  ['acct_', 'account'],
  ['tr_', 'transfer'],
  ['po_', 'payout'],
  ['txn_', 'balance_transaction'],
  ['evt_', 'event'],
];

type JsonObject = Record<string, unknown>;

function isJsonObject(value: unknown): value is JsonObject {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function cannotExpand(path: string[]): never {
  throw invalidRequest(`This property cannot be expanded (${path.join('.')}).`, { param: 'expand' });
}

/** Fields that are not stored on an object but can be expanded into it, such as a session's `line_items`. */
export type VirtualField = (object: JsonObject, state: StateStore) => unknown;

export interface ExpandSource {
  state: StateStore;
  /** Objects on this connected account ('' for the platform) are the ones ids resolve to. */
  account: string;
  virtualFields: Record<string, VirtualField>;
}

function resolve(id: string, { state, account }: ExpandSource): StripeObject | undefined {
  const type = TYPES_BY_PREFIX.find(([prefix]) => id.startsWith(prefix))?.[1];
  if (!type) return undefined;
  // Connected accounts themselves are platform objects, whichever account the request acts for.
  return type === 'account' ? state.get(type, id) : state.get(type, id, account);
}

function expandAt(target: JsonObject, segments: string[], path: string[], source: ExpandSource): void {
  const [field, ...rest] = segments;
  if (field === undefined) return;
  const here = [...path, field];
  let value = target[field];
  if (target.object === 'list' && field === 'data' && Array.isArray(value)) {
    if (rest.length === 0) cannotExpand(here);
    for (const item of value) if (isJsonObject(item)) expandAt(item, rest, here, source);
    return;
  }
  if (typeof value === 'string') {
    const found = resolve(value, source);
    if (!found) cannotExpand(here);
    value = structuredClone(found);
    target[field] = value;
  } else if (value === undefined) {
    const virtual = source.virtualFields[`${String(target.object)}.${field}`];
    if (!virtual) cannotExpand(here);
    value = virtual(target, source.state);
    target[field] = value;
  } else if (value !== null && !isJsonObject(value)) {
    cannotExpand(here);
  }
  if (rest.length > 0 && isJsonObject(value)) expandAt(value, rest, here, source);
}

/** The `expand[]` paths of a request, from its query (GET) or its body (POST). */
export function expandPaths(query: FormObject, body: FormObject): string[] {
  const raw = query.expand ?? body.expand;
  if (raw === undefined || raw === '') return [];
  if (!Array.isArray(raw) || raw.some((path) => typeof path !== 'string')) {
    throw invalidRequest('Invalid array', { param: 'expand' });
  }
  return raw as string[];
}

/**
 * Replaces ids in a response body by the objects they name (`payment_intent`,
 * `data.latest_charge`, `payment_intent.latest_charge`), in place: pass a copy.
 */
export function expandResponse(body: unknown, paths: string[], source: ExpandSource): void {
  if (!isJsonObject(body)) return;
  for (const path of paths) expandAt(body, path.split('.'), [], source);
}
