import { invalidRequest } from './errors';

export type FormValue = string | FormValue[] | FormObject;
export interface FormObject {
  [key: string]: FormValue;
}

type Container = FormObject | FormValue[];

const KEY_PATTERN = /^([^[\]]+)((?:\[[^[\]]*\])*)$/;
const INDEX_PATTERN = /^(?:0|[1-9]\d{0,5})$/;

function keySegments(key: string): string[] {
  const match = KEY_PATTERN.exec(key);
  if (!match) {
    throw invalidRequest(`Received unknown parameter: ${key}`, { code: 'parameter_unknown', param: key });
  }
  const [, head = '', brackets = ''] = match;
  return [head, ...Array.from(brackets.matchAll(/\[([^[\]]*)\]/g), (bracket) => bracket[1] ?? '')];
}

function paramName(segments: string[]): string {
  return (
    segments[0] +
    segments
      .slice(1)
      .map((segment) => `[${segment}]`)
      .join('')
  );
}

function isIndex(segment: string): boolean {
  return segment === '' || INDEX_PATTERN.test(segment);
}

function childOf(container: Container, segment: string): FormValue | undefined {
  if (Array.isArray(container)) return segment === '' ? undefined : container[Number(segment)];
  return Object.hasOwn(container, segment) ? container[segment] : undefined;
}

function setChild(container: Container, segment: string, value: FormValue): void {
  if (Array.isArray(container)) {
    if (segment === '') container.push(value);
    else container[Number(segment)] = value;
    return;
  }
  // defineProperty rather than assignment, so a key named __proto__ is data and not a prototype.
  Object.defineProperty(container, segment, { value, enumerable: true, writable: true, configurable: true });
}

function shapeError(expected: 'hash' | 'array', segments: string[]): never {
  throw invalidRequest(`Invalid ${expected}`, { param: paramName(segments) });
}

function assign(root: FormObject, segments: string[], value: string): void {
  let container: Container = root;
  for (let depth = 0; depth < segments.length - 1; depth += 1) {
    const segment = segments[depth] ?? '';
    // The next segment decides the shape: `items[0]` and `items[]` make an array, `items[x]` a hash.
    const wantsArray = isIndex(segments[depth + 1] ?? '');
    const path = segments.slice(0, depth + 1);
    let child = childOf(container, segment);
    if (child === undefined) {
      child = wantsArray ? [] : {};
      setChild(container, segment, child);
    }
    if (typeof child === 'string') shapeError(wantsArray ? 'array' : 'hash', path);
    if (Array.isArray(child) && !wantsArray) shapeError('hash', path);
    container = child;
  }
  const last = segments[segments.length - 1] ?? '';
  const existing = childOf(container, last);
  if (existing !== undefined && typeof existing !== 'string') {
    shapeError(Array.isArray(existing) ? 'array' : 'hash', segments);
  }
  setChild(container, last, value);
}

/** Arrays given as `items[0]`, `items[2]` come out dense, in index order. */
function compact(value: FormValue): FormValue {
  if (typeof value === 'string') return value;
  if (Array.isArray(value)) return value.filter(() => true).map(compact);
  for (const key of Object.keys(value)) setChild(value, key, compact(value[key] ?? ''));
  return value;
}

/**
 * Decodes the provider's form encoding (`line_items[0][price_data][currency]=eur`,
 * `expand[]=data.customer`) into nested objects and arrays. Values stay strings, as on the wire;
 * each endpoint coerces the ones it reads.
 */
export function parseFormBody(encoded: string): FormObject {
  const root: FormObject = {};
  for (const [key, value] of new URLSearchParams(encoded)) {
    assign(root, keySegments(key), value);
  }
  return compact(root) as FormObject;
}
