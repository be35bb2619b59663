/**
 * Hostile input for the fuzzing: JSON bodies written as raw text (so `__proto__` keys, numbers beyond
 * a double, duplicate keys and thousands of nesting levels reach the server as a client could send
 * them), query strings, and the judgement of an answer.
 */
import fc from 'fast-check';

/** A raw JSON token, written as is: `1e400`, a 40-digit integer. */
class RawJson {
  constructor(readonly text: string) {}
}
/** An object as a list of entries, so keys like `__proto__` and duplicates survive into the text. */
class Entries {
  constructor(readonly entries: [string, Json][]) {}
}
export type Json = null | boolean | number | string | RawJson | Entries | Json[] | { [key: string]: Json };

interface Sent {
  text: string;
  /** Every string in the request (keys and values): an answer may quote them back without leaking anything. */
  strings: string[];
}

export function serialize(value: Json, strings: string[] = []): Sent {
  const write = (v: Json): string => {
    if (v instanceof RawJson) return v.text;
    if (v instanceof Entries) return `{${v.entries.map(([k, x]) => (strings.push(k), `${JSON.stringify(k)}:${write(x)}`)).join(',')}}`;
    if (Array.isArray(v)) return `[${v.map(write).join(',')}]`;
    if (typeof v === 'string') {
      strings.push(v);
      return JSON.stringify(v);
    }
    if (v !== null && typeof v === 'object') return write(new Entries(Object.entries(v)));
    return JSON.stringify(v) ?? 'null';
  };
  return { text: write(value), strings };
}

const FRAGMENTS = [
  "' OR '1'='1",
  "'; DROP TABLE users; --",
  '" OR ""="',
  '1 UNION SELECT password_hash FROM users --',
  "') OR 1=1 --",
  '%',
  '_',
  '\\',
  "\\'",
  '<script>alert(1)</script>',
  '"><img src=x onerror=alert(1)>',
  'javascript:alert(1)',
  '<svg/onload=alert(1)>',
  '{{7*7}}',
  '${7*7}',
  '../../../../etc/passwd',
  '..\\..\\windows\\win.ini',
  '%2e%2e%2f',
  '\u0000',
  'a\u0000b',
  '\r\nSet-Cookie: pwned=1',
  '\uFEFF',
  '\u202Eevil',
  '\uD800',
  '𝕏🧪👩‍🔬',
  'e\u0301',
  'İı',
  'NaN',
  'Infinity',
  '-Infinity',
  '1e309',
  '-0',
  '0x1F',
  '',
  '   ',
  'null',
  'undefined',
  'true',
  '[]',
  '{}',
  '__proto__',
  'constructor',
  'prototype',
  'toString',
  'hasOwnProperty',
  'a'.repeat(5000),
  'a@b.c',
  ' BUYER@DEMO.LIGHTYARD.EXAMPLE ',
] as const;

const POLLUTING_KEYS = ['__proto__', 'constructor', 'prototype', '__defineGetter__', 'toString', 'valueOf'] as const;

const fragment = fc.constantFrom(...FRAGMENTS);

/** Strings up to `longest` characters: attack fragments, unicode, control characters, long runs of multi-byte text. */
function hostileText(longest: number): fc.Arbitrary<string> {
  return fc.oneof(
    { weight: 4, arbitrary: fragment.filter((s) => s.length <= longest) },
    { weight: 2, arbitrary: fc.string({ unit: 'grapheme', maxLength: Math.min(40, longest) }) },
    { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: Math.min(40, longest) }) },
    {
      weight: 2,
      arbitrary: fc.tuple(fc.string({ maxLength: 10 }), fragment, fc.string({ maxLength: 10 })).map((p) => p.join('').slice(0, longest)),
    },
    { weight: 1, arbitrary: fc.integer({ min: 1, max: longest }).map((n) => 'ß'.repeat(n)) },
  );
}

/** For bodies: long enough to pass any field's maximum, short enough that a body stays near the 64 KiB limit. */
const hostileString = hostileText(20_000);
/**
 * For URLs and headers, which Node's HTTP server caps at 16 KiB in all (431 before the app sees them;
 * the body-limit tests check that separately).
 */
export const shortHostileString = hostileText(200);

const hostileNumber: fc.Arbitrary<Json> = fc.oneof(
  fc.constantFrom<Json>(0, -0, -1, 1, 0.5, 5e-324, 2 ** 31, 2 ** 53, 2 ** 53 + 2, 1e21, 1e308, -1e308, Number.MAX_SAFE_INTEGER),
  fc.integer().map<Json>((n) => n),
  fc.double({ noNaN: true, noDefaultInfinity: true }).map<Json>((n) => n),
  fc
    .constantFrom(...['1e400', '-1e400', '1e-400', '123456789012345678901234567890123456789', '-0.0', '0e0', '1E+2'])
    .map((t) => new RawJson(t)),
);

/** Any JSON value, wrongly typed for whatever field it lands in, nested a few levels. */
const hostileValue: fc.Arbitrary<Json> = fc.letrec<{ value: Json }>((tie) => ({
  value: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    { weight: 5, arbitrary: hostileString },
    { weight: 3, arbitrary: hostileNumber },
    { weight: 1, arbitrary: fc.constantFrom<Json>(true, false, null) },
    { weight: 1, arbitrary: fc.array(tie('value'), { maxLength: 4 }) },
    {
      weight: 1,
      arbitrary: fc
        .array(fc.tuple(fc.oneof(hostileString, fc.constantFrom(...POLLUTING_KEYS)), tie('value')), { maxLength: 4 })
        .map((e) => new Entries(e)),
    },
  ),
})).value;

/** `[[[[…]]]]` or `{"a":{"a":…}}`, up to 5000 levels: within the body limit, deeper than any schema. */
export const deepNesting: fc.Arbitrary<Json> = fc
  .tuple(fc.integer({ min: 50, max: 5000 }), fc.boolean())
  .map(([n, arrays]) => new RawJson(arrays ? `${'['.repeat(n)}${']'.repeat(n)}` : `${'{"a":'.repeat(n)}1${'}'.repeat(n)}`));

/** Keys that try to reach an object's prototype, with values that would matter if they did. */
const pollution: fc.Arbitrary<[string, Json][]> = fc.subarray<[string, Json]>(
  [
    [
      '__proto__',
      new Entries([
        ['isAdmin', true],
        ['roles', ['admin']],
        ['emailVerified', true],
      ]),
    ],
    ['constructor', new Entries([['prototype', new Entries([['isAdmin', true]])]])],
    ['__proto__', new Entries([['status', 'live']])],
    ['prototype', new Entries([['role', 'owner']])],
  ],
  { minLength: 1 },
);

/**
 * A body of named fields: one of `shapes`, or every known field at once (zod objects drop keys they do not
 * know, so the superset passes any schema that is not strict). Field values are valid ones from `valid`,
 * all taken at the same index so that they agree with each other (a search mode with its goal; list them
 * that way), except up to three that are hostile, nested thousands deep or left out; now and then a
 * polluting key rides along. Or the body is anything at all.
 */
export function hostileBody(shapes: readonly (readonly string[])[], valid: Record<string, readonly Json[]>): fc.Arbitrary<Json> {
  const everything = [...new Set(shapes.flat())];
  const spoiled = (name: string): fc.Arbitrary<[string, Json] | null> =>
    fc.oneof(
      { weight: 3, arbitrary: hostileValue.map<[string, Json]>((v) => [name, v]) },
      { weight: 1, arbitrary: deepNesting.map<[string, Json]>((v) => [name, v]) },
      { weight: 1, arbitrary: fc.constant(null) },
    );
  const extra = fc.oneof({ weight: 3, arbitrary: fc.constant<[string, Json][]>([]) }, { weight: 1, arbitrary: pollution });
  const body = (names: readonly string[]) =>
    fc.tuple(fc.nat({ max: 4 }), fc.subarray([...names], { maxLength: Math.min(3, names.length) }), extra).chain(([i, spoil, more]) =>
      fc
        .tuple(
          ...names.map((name) => {
            const good = valid[name] ?? [];
            return spoil.includes(name) || good.length === 0
              ? spoiled(name)
              : fc.constant<[string, Json]>([name, good[Math.min(i, good.length - 1)]!]);
          }),
        )
        .map((fields) => new Entries([...fields.filter((f): f is [string, Json] => f !== null), ...more])),
    );
  return fc.oneof(
    { weight: 4, arbitrary: fc.constantFrom(...shapes).chain(body) },
    { weight: 2, arbitrary: body(everything) },
    { weight: 1, arbitrary: hostileValue },
    { weight: 1, arbitrary: deepNesting },
    { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) as fc.Arbitrary<Json> },
  );
}

/** A query string of known and hostile keys with valid and hostile values; returns `?…` (or '') and the decoded strings. */
export function hostileQuery(valid: Record<string, readonly string[]>): fc.Arbitrary<{ query: string; strings: string[] }> {
  const keys = Object.keys(valid);
  const pair = fc.oneof(
    {
      weight: 4,
      arbitrary: fc
        .constantFrom(...keys)
        .chain((k) =>
          fc.tuple(
            fc.constant(k),
            fc.oneof({ weight: 2, arbitrary: fc.constantFrom(...valid[k]!) }, { weight: 1, arbitrary: shortHostileString }),
          ),
        ),
    },
    { weight: 1, arbitrary: fc.tuple(fc.oneof(shortHostileString, fc.constantFrom(...POLLUTING_KEYS)), shortHostileString) },
  );
  return fc.array(pair, { maxLength: 6 }).map((pairs) => {
    const params = new URLSearchParams();
    for (const [k, v] of pairs) params.append(k, v);
    const text = params.toString();
    return { query: text ? `?${text}` : '', strings: pairs.flat() };
  });
}

/** A path segment: a real id most of the time, else something hostile (encoded, so it stays one segment). */
export function segment(real: readonly string[]): fc.Arbitrary<{ text: string; raw: string }> {
  return fc
    .oneof(...(real.length ? [{ weight: 3, arbitrary: fc.constantFrom(...real) }] : []), {
      weight: 1,
      arbitrary: shortHostileString.filter((s) => s.length > 0),
    })
    .map((raw) => ({ raw, text: encodeSegment(raw) || '-' }));
}

/** Percent-encodes one path segment; a lone surrogate has no UTF-8 form, so it is dropped rather than thrown on. */
export const encodeSegment = (raw: string) => encodeURIComponent(raw.replace(/[\uD800-\uDFFF]/g, ''));

// Stack frames, driver and ORM errors, and SQL as the ORM writes it, with quoted table names (raw or
// JSON-escaped): the attack fragments above, which other cases store in names and listings, quote none.
const STACK = /\bat [^\n"]*\.(ts|js|mjs|cjs):\d+/;
const DRIVER = /SQLITE_|SqliteError|LibsqlError|Failed query|no such (table|column)|syntax error|drizzle/i;
const SQL = /\bselect\b[^]{0,300}?\bfrom\s+\\?["`]\w+\\?["`]/i;

function withoutEchoes(text: string, strings: readonly string[]): string {
  const forms = new Set<string>();
  for (const s of strings) {
    for (const f of [s, s.trim(), s.toLowerCase(), s.trim().toLowerCase()]) {
      if (f.length < 3) continue;
      forms.add(f);
      forms.add(JSON.stringify(f).slice(1, -1));
    }
  }
  let out = text;
  for (const f of [...forms].sort((a, b) => b.length - a.length)) out = out.split(f).join(' ');
  return out;
}

/**
 * What is wrong with an answer, or null: a 5xx; a stack trace, driver error or SQL the client did not
 * send; for the API, anything ≥ 400 that is not `{ error: { code, message, fields? } }` as JSON.
 */
export function judge(res: Response, text: string, url: string, sentStrings: readonly string[]): string | null {
  if (res.status >= 500) return `status ${res.status}`;
  const isApi = new URL(url).pathname.startsWith('/api/');
  for (const leak of [STACK, DRIVER, SQL]) {
    // the echo-free text is only worth building when the raw answer looks suspicious
    const m = leak.test(text) ? withoutEchoes(text, sentStrings).match(leak) : null;
    if (m) return `leaks ${JSON.stringify(m[0].slice(0, 120))}`;
  }
  if (!isApi || res.status < 400) return null;
  if (!(res.headers.get('content-type') ?? '').startsWith('application/json')) return `content-type ${res.headers.get('content-type')}`;
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return 'a body that is not JSON';
  }
  const error = (body as { error?: Record<string, unknown> }).error;
  const shapeOk =
    Object.keys(body as object).length === 1 &&
    !!error &&
    typeof error.code === 'string' &&
    typeof error.message === 'string' &&
    Object.keys(error).every((k) => ['code', 'message', 'fields'].includes(k)) &&
    (error.fields === undefined ||
      (typeof error.fields === 'object' && error.fields !== null && Object.values(error.fields).every((v) => typeof v === 'string')));
  return shapeOk ? null : `not the error shape: ${text.slice(0, 200)}`;
}
