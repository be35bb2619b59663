/**
 * Hostile input against every route read from src/pages: bodies, query strings, path segments,
 * session cookies and the client address, 500 cases per API handler (fewer per page, which renders
 * HTML). Nothing may answer 5xx or show a stack trace, a driver error or SQL, and every API error is
 * the JSON error shape. Then the body limits, one route at a time: 415, 413 and 400.
 *
 * The app trusts X-Forwarded-For here and each case comes from an address of its own, so the
 * per-address limits (sign-in failures, the fit, search and unsubscribe rate limits) do not turn
 * most cases into 429s before they reach a validator; a 429 is still a valid answer.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startTestApp, type TestApp } from '../setup/app';
import {
  deepNesting,
  encodeSegment,
  hostileBody,
  hostileQuery,
  judge,
  segment,
  serialize,
  shortHostileString,
  type Json,
} from '../setup/hostile';
import { discoverRoutes, routeKey, type DiscoveredRoute, type RouteHandler } from '../setup/routes';
import { buildWorld, mirrorListing, type World } from '../setup/world';
import { LASER_SPECS, MIRROR_SPECS, PHOTODIODE_SPECS, SPD_SPECS } from '../unit/specs/fixtures';

const API_RUNS = 500;
const PAGE_RUNS = 100;

let app: TestApp;
let w: World;
let started = 0;

interface Endpoint {
  route: DiscoveredRoute;
  handler: RouteHandler;
  key: string;
}
const routes = discoverRoutes();
const handlers: Endpoint[] = routes.flatMap((route) =>
  route.handlers.map((handler) => ({ route, handler, key: routeKey(handler.method, route.pattern) })),
);
const api = handlers.filter((e) => e.route.kind === 'api');
const pages = handlers.filter((e) => e.route.kind === 'page');
const tally = new Map<string, Record<string, number>>();

beforeAll(async () => {
  app = await startTestApp({ env: { TRUST_PROXY: '1' } });
  w = await buildWorld(app);
  started = Date.now();
}, 180_000);
afterAll(async () => {
  await app?.stop();
  if (!started) return;
  const cases = [...tally.values()].reduce((n, t) => n + Object.values(t).reduce((a, b) => a + b, 0), 0);
  const classes = (t: Record<string, number>) =>
    Object.entries(t)
      .sort()
      .map(([k, v]) => `${k}:${v}`)
      .join(' ');
  console.log(
    [
      `Fuzz: ${cases} cases over ${tally.size} handlers (${api.length} API × ${API_RUNS}, ${pages.length} pages × ${PAGE_RUNS}, plus shrinking if any failed) in ${((Date.now() - started) / 1000).toFixed(1)} s`,
      ...[...tally].map(([k, t]) => `  ${k.padEnd(58)} ${classes(t)}`),
    ].join('\n'),
  );
});

/** Who sends a case: nobody, a made-up session cookie, the owner of lab A (a seller), the admin. */
type Who = 'anonymous' | 'forged' | 'seller' | 'admin';
const CALLERS: Who[] = ['anonymous', 'forged', 'seller', 'seller', 'admin'];
/** Signing out ends the session it is sent with: only callers without a real one. */
const SESSION_ENDING = new Set(['POST /api/auth/sign-out', 'POST /sign-out']);

function cookieOf(who: Who, forged: string): string | undefined {
  const jar = w.client.ownerA.cookies;
  const name = [...jar.keys()][0]!;
  if (who === 'anonymous') return undefined;
  if (who === 'forged') return `${name}=${forged}`;
  const c = w.client[who === 'seller' ? 'ownerA' : 'admin'];
  return [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
}

/** Real values for a path parameter, so a good share of cases reach the code behind the lookups. */
function realValues(pattern: string, param: string): string[] {
  if (param === 'kind') return ['cavity', 'modes', 'squeezing', 'counting', 'laser', 'crystal'];
  if (param === 'role') return ['buyer', 'seller', 'moderator', 'admin'];
  if (param === 'fileId') return [w.fileLive, w.fileHidden];
  if (param === 'lab' || param === 'slug') return [w.labA.id, w.labA.slug, w.labB.slug];
  // never the fuzzing callers themselves: removing the seller from its lab would only narrow the fuzzing
  if (param === 'user') return [w.user.memberA.id, w.bystander];
  if (param.startsWith('...')) return ['x', 'a/b', ''];
  if (/\/orders\b/.test(pattern)) return [w.order.id];
  if (/\/(threads|messages)\b/.test(pattern)) return [w.thread];
  if (pattern.includes('saved-searches')) return [w.savedSearch];
  if (pattern.includes('/reports')) return [w.report];
  if (pattern.startsWith('/api/admin/users')) return [w.bystander];
  if (pattern.includes('/cart/items')) return [];
  return [w.liveA, w.reviewA, w.draftA, w.stock];
}

const CAVITY_SEARCH_GOAL = { wavelengthNm: 852, finesse: 100_000, lengthMm: 50, configuration: 'pair' };
const FIT_CAVITY_GOAL = { wavelengthNm: 852, lengthM: 0.05, target: { kind: 'finesse', value: 100_000 }, configuration: 'pair' };
const SQUEEZING_GOAL = {
  wavelengthNm: 1550,
  targetDb: 3,
  sidebandHz: 1e6,
  source: { kind: 'initial', initialDb: 10 },
  escapeEfficiency: 0.95,
  propagationEfficiency: 0.95,
  visibility: 0.98,
  loPowerW: 0.005,
};
const COUNTING_GOAL = { wavelengthNm: 1550, target: { kind: 'heralding', efficiency: 0.5 }, opticalEfficiency: 0.8 };
const LASER_GOAL = { wavelength: { kind: 'fixed', nm: 1064 }, minPowerW: 0.1 };

/** The field sets of the API's bodies; every case picks one, so each route meets its own shape among others. */
const SHAPES = [
  ['email', 'password', 'name'],
  ['email', 'password'],
  ['email'],
  ['token'],
  ['token', 'password'],
  ['currentPassword', 'newPassword'],
  ['name'],
  ['name', 'institute', 'country'],
  ['listingId', 'quantity'],
  ['shipTo', 'endUse'],
  ['carrier', 'trackingNumber'],
  ['amountCents', 'reason'],
  ['reason'],
  ['role'],
  ['action', 'reason'],
  ['hazards', 'exportControlled', 'exportNote'],
  ['body'],
  ['kind', 'filename', 'contentType', 'size', 'measurementKind'],
  ['labId', 'category', 'title', 'description', 'condition', 'quantity', 'priceCents', 'currency', 'shipsTo', 'specs'],
  ['version', 'title', 'quantity', 'priceCents', 'specs'],
  ['labId'],
  ['active'],
  ['mode', 'goal', 'q', 'filters', 'sort', 'page', 'pageSize'],
  ['name', 'search', 'url'],
  ['goal', 'mirrorA', 'mirrorB'],
  ['lengthM', 'roc1M', 'roc2M', 'wavelengthM'],
  ['goal', 'detector'],
  ['goal', 'laser'],
  ['pumpM', 'signalM', 'idlerM', 'type', 'dataset', 'temperatureC'],
] as const;

/** Valid values; lists that go together are aligned by index (mode, goal, detector, laser: index 2 is squeezing). */
function validFields(): Record<string, readonly Json[]> {
  const listing = mirrorListing('Fuzzed listing');
  return {
    // never a real password: a right guess would change the seller's password and end its session
    email: ['buyer@demo.lightyard.example', 'fuzz.person@lab.example', 'seller@demo.lightyard.example'],
    password: ['fuzz-password-123'],
    name: ['Fuzz Person'],
    token: ['t'.repeat(43), w.inviteToken],
    currentPassword: ['not-the-password-1'],
    newPassword: ['fuzz-new-password-1'],
    institute: ['Institute of Fuzzing'],
    country: ['NL', 'de'],
    listingId: [w.stock, w.liveA],
    quantity: [1, 2],
    shipTo: ['EU', 'WORLD'],
    endUse: [{}, { [w.stock]: 'Research use in our own cavity experiment.' }],
    carrier: ['Lab courier'],
    trackingNumber: ['LY-12345'],
    amountCents: [100],
    reason: ['A reason that is long enough.'],
    role: ['seller', 'moderator'],
    action: ['approve', 'request-changes', 'reject'],
    hazards: [['laser'], []],
    exportControlled: [false, true],
    exportNote: [null, 'Dual-use note'],
    body: ['Is this still available?'],
    kind: ['photo', 'datasheet', 'measurement'],
    filename: ['part.png', 'sheet.pdf', 'trace.csv'],
    contentType: ['image/png', 'application/pdf', 'text/csv'],
    size: [1000],
    measurementKind: ['spectrum', 'ringdown'],
    labId: [w.labA.id],
    category: ['cavity-mirror'],
    title: ['A fuzzed title'],
    description: ['A description with **markdown**.'],
    condition: ['new'],
    priceCents: [10_000],
    currency: ['EUR'],
    shipsTo: [['WORLD'], ['EU', 'UK']],
    specs: [listing.specs, MIRROR_SPECS],
    version: [1, 2],
    active: [true, false],
    mode: ['cavity', 'cavity', 'squeezing', 'counting', 'laser'],
    goal: [CAVITY_SEARCH_GOAL, FIT_CAVITY_GOAL, SQUEEZING_GOAL, COUNTING_GOAL, LASER_GOAL],
    q: ['mirror', 'cesium'],
    filters: [{ category: ['cavity-mirror'] }, {}],
    sort: ['fit', 'price', 'relevance', 'newest'],
    page: [1, 2],
    pageSize: [10],
    search: [
      { mode: 'text', q: 'mirror' },
      { mode: 'cavity', goal: CAVITY_SEARCH_GOAL },
    ],
    url: ['/search?q=mirror'],
    mirrorA: [MIRROR_SPECS],
    mirrorB: [MIRROR_SPECS],
    detector: [PHOTODIODE_SPECS, PHOTODIODE_SPECS, PHOTODIODE_SPECS, SPD_SPECS],
    laser: [LASER_SPECS],
    lengthM: [0.05],
    roc1M: [0.1, null],
    roc2M: [0.1, null],
    wavelengthM: [1.064e-6],
    pumpM: [7.75e-7],
    signalM: [1.55e-6],
    idlerM: [1.55e-6],
    type: ['type-0', 'type-II'],
    dataset: ['kato2002'],
    temperatureC: [40],
  };
}

function validQuery(): Record<string, readonly string[]> {
  return {
    q: ['mirror', 'cesium 852'],
    status: ['paid', 'live', 'draft'],
    lab: [w.labA.id, w.labA.slug],
    since: ['2020-01-01'],
    limit: ['10'],
    offset: ['0', '20'],
    mine: ['1', '0'],
    category: ['cavity-mirror', 'laser,photodiode'],
    condition: ['new'],
    region: ['EU'],
    sort: ['newest', 'price-asc'],
    page: ['1', '2'],
    pageSize: ['5'],
    variant: ['w320', 'full', 'original'],
    as: ['lab', 'buyer'],
    token: ['t'.repeat(43)],
    session_id: [w.order.sessionId],
    next: ['/desk', '//evil.example', 'https://evil.example/'],
  };
}

const forgedCookie = fc.oneof(fc.string({ unit: 'binary-ascii', maxLength: 60 }), shortHostileString).map(encodeSegment);
const clientAddress = fc.oneof(
  { weight: 8, arbitrary: fc.ipV4() },
  { weight: 1, arbitrary: fc.ipV6() },
  { weight: 1, arbitrary: fc.constantFrom('unknown', '', ' , ', '1.2.3.4, 5.6.7.8', "'; DROP TABLE rate_counters; --", 'a'.repeat(2000)) },
);

interface Case {
  who: Who;
  forged: string;
  segments: { text: string; raw: string }[];
  query: { query: string; strings: string[] };
  body: Json;
  contentType: string;
  address: string;
  method: string;
}

function caseOf(e: Endpoint): fc.Arbitrary<Case> {
  const isPage = e.route.kind === 'page';
  const formBody = fc
    .array(fc.tuple(fc.oneof(fc.constant('token'), shortHostileString), shortHostileString), { maxLength: 4 })
    .map<Json>((pairs) => new URLSearchParams(pairs).toString());
  return fc.record({
    who: fc.constantFrom(...(SESSION_ENDING.has(e.key) ? (['anonymous', 'forged'] as Who[]) : CALLERS)),
    forged: forgedCookie,
    segments: fc.tuple(...e.route.params.map((p) => segment(realValues(e.route.pattern, p)))),
    query: hostileQuery(validQuery()),
    body: isPage ? formBody : hostileBody(SHAPES, validFields()),
    contentType: isPage
      ? fc.constant('application/x-www-form-urlencoded')
      : fc.constantFrom('application/json', 'application/json', 'application/json', 'application/json; charset=utf-8', 'APPLICATION/JSON'),
    address: clientAddress,
    method: e.handler.method === 'ALL' ? fc.constantFrom('GET', 'POST', 'PUT', 'PATCH', 'DELETE') : fc.constant(e.handler.method),
  });
}

function pathOf(e: Endpoint, segments: { text: string; raw: string }[]): string {
  let i = 0;
  return e.route.pattern.replace(/\[([^\]]+)\]/g, (_, name: string) => {
    const s = segments[i++]!;
    // a rest parameter may span segments: keep the slashes of its real values
    return name.startsWith('...') ? s.raw.split('/').map(encodeSegment).join('/') : s.text;
  });
}

async function run(e: Endpoint, c: Case): Promise<void> {
  const url = `${app.origin}${pathOf(e, c.segments)}${c.query.query}`;
  const headers: Record<string, string> = { origin: app.origin, 'x-forwarded-for': c.address };
  const cookie = cookieOf(c.who, c.forged);
  if (cookie) headers.cookie = cookie;
  const sent =
    typeof c.body === 'string' && e.route.kind === 'page'
      ? { text: c.body, strings: [...new URLSearchParams(c.body)].flat() }
      : serialize(c.body);
  const hasBody = c.method !== 'GET';
  if (hasBody) headers['content-type'] = c.contentType;
  const res = await fetch(url, { method: c.method, headers, body: hasBody ? sent.text : undefined, redirect: 'manual' });
  const text = await res.text();
  const t = tally.get(e.key) ?? {};
  t[`${String(res.status)[0]}xx`] = (t[`${String(res.status)[0]}xx`] ?? 0) + 1;
  tally.set(e.key, t);
  const problem =
    judge(res, text, url, [...sent.strings, ...c.query.strings, ...c.segments.map((s) => s.raw)]) ??
    // unsigned, whatever it says: the webhook refuses it before reading it
    (e.route.pattern.startsWith('/api/webhooks/') && res.status !== 400 ? `an unsigned event answered ${res.status}` : null);
  if (problem)
    throw new Error(
      `${c.method} ${url.slice(0, 300)} as ${c.who}: ${problem}\nbody: ${sent.text.slice(0, 300)}\nanswer ${res.status}: ${text.slice(0, 300)}`,
    );
}

describe.concurrent('hostile bodies, queries, path segments, cookies and addresses', () => {
  for (const e of [...api, ...pages]) {
    const runs = e.route.kind === 'api' ? API_RUNS : PAGE_RUNS;
    test(`${e.key}: ${runs} cases, no 5xx, no leak${e.route.kind === 'api' ? ', errors in the JSON shape' : ''}`, async () => {
      await fc.assert(
        fc.asyncProperty(caseOf(e), (c) => run(e, c)),
        { numRuns: runs },
      );
    }, 600_000);
  }
});

/** The first caller whose guard lets the request through to the body (an answer other than 401/403/404). */
async function pastTheGuard(
  e: Endpoint,
  init: (headers: Record<string, string>) => RequestInit,
): Promise<{ res: Response; text: string; tried: string[] }> {
  const path = pathOf(
    e,
    e.route.params.map((p) => {
      const raw = realValues(e.route.pattern, p)[0] ?? 'none';
      return { raw, text: encodeURIComponent(raw) };
    }),
  );
  const tried: string[] = [];
  for (const role of ['ownerA', 'admin', 'buyer', 'anonymous'] as const) {
    const c = w.client[role];
    const headers: Record<string, string> = { origin: app.origin };
    if (c.cookies.size) headers.cookie = [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    const res = await fetch(app.origin + path, { method: e.handler.method, redirect: 'manual', ...init(headers) });
    const text = await res.text();
    const problem = judge(res, text, app.origin + path, []);
    if (problem) throw new Error(`${e.key} as ${role}: ${problem}`);
    tried.push(`${role}: ${res.status}`);
    if (![401, 403, 404].includes(res.status)) return { res, text, tried };
  }
  throw new Error(`${e.key}: no caller got past the guard (${tried.join(', ')})`);
}

const code = (text: string) => (JSON.parse(text) as { error: { code: string } }).error.code;
const streamed = (text: string) =>
  new ReadableStream<Uint8Array>({
    start(controller) {
      const bytes = new TextEncoder().encode(text);
      for (let i = 0; i < bytes.length; i += 8192) controller.enqueue(bytes.subarray(i, i + 8192));
      controller.close();
    },
  });

describe('body limits, route by route', () => {
  const jsonRoutes = api.filter((e) => e.handler.readsJson);
  const rawRoutes = api.filter((e) => e.handler.readsRawBody);
  const oversized = JSON.stringify({ pad: 'x'.repeat(64 * 1024) });

  test('only the webhook reads a body past readJson and its limits', () => {
    expect(rawRoutes.map((e) => e.key).filter((k) => !k.startsWith('POST /api/webhooks/'))).toEqual([]);
    expect(jsonRoutes.length).toBeGreaterThan(0);
  });

  for (const e of jsonRoutes) {
    test(`${e.key}: 415 for text/plain, 413 over 64 KiB (declared or streamed), 400 for malformed JSON`, async () => {
      const wrongType = await pastTheGuard(e, (h) => ({ headers: { ...h, 'content-type': 'text/plain' }, body: '{"email":"a@b.c"}' }));
      expect([wrongType.res.status, code(wrongType.text)], wrongType.tried.join(', ')).toEqual([415, 'unsupported_media_type']);
      const tooBig = await pastTheGuard(e, (h) => ({ headers: { ...h, 'content-type': 'application/json' }, body: oversized }));
      expect([tooBig.res.status, code(tooBig.text)], tooBig.tried.join(', ')).toEqual([413, 'payload_too_large']);
      const tooBigStreamed = await pastTheGuard(
        e,
        (h) => ({ headers: { ...h, 'content-type': 'application/json' }, body: streamed(oversized), duplex: 'half' }) as RequestInit,
      );
      expect([tooBigStreamed.res.status, code(tooBigStreamed.text)], tooBigStreamed.tried.join(', ')).toEqual([413, 'payload_too_large']);
      const malformed = await pastTheGuard(e, (h) => ({
        headers: { ...h, 'content-type': 'application/json' },
        body: '{"email": "a@b.c",',
      }));
      expect([malformed.res.status, code(malformed.text)], malformed.tried.join(', ')).toEqual([400, 'bad_request']);
    });
  }

  test('a request line and headers beyond 16 KiB answer 431 from the HTTP server, before the app', async () => {
    const res = await fetch(`${app.origin}/api/search?q=${encodeURIComponent('ß'.repeat(5000))}`);
    expect(res.status).toBe(431);
  });

  test('POST /unsubscribe (a page form): 413 over 8 KiB, declared or streamed, 415 for JSON; nothing stopped', async () => {
    const form = { 'content-type': 'application/x-www-form-urlencoded', origin: app.origin };
    const big = `token=${'z'.repeat(43)}&pad=${'x'.repeat(9 * 1024)}`;
    expect((await fetch(`${app.origin}/unsubscribe`, { method: 'POST', headers: form, body: big })).status).toBe(413);
    const streamedBig = await fetch(`${app.origin}/unsubscribe`, {
      method: 'POST',
      headers: form,
      body: streamed(big),
      duplex: 'half',
    } as RequestInit);
    expect(streamedBig.status).toBe(413);
    expect(await streamedBig.text()).toContain('larger than 8 KiB');
    const json = await fetch(`${app.origin}/unsubscribe`, {
      method: 'POST',
      headers: { ...form, 'content-type': 'application/json' },
      body: JSON.stringify({ token: 'z'.repeat(43) }),
    });
    expect(json.status).toBe(415);
    const fine = await fetch(`${app.origin}/unsubscribe`, { method: 'POST', headers: form, body: `token=${'z'.repeat(43)}` });
    expect(fine.status).toBe(200);
    expect(await fine.text()).toContain('This link does not stop any saved search');
  });

  // The webhook reads the raw body to check its signature: its own limit, and 400 for anything unsigned.
  for (const e of rawRoutes) {
    test(`${e.key}: 413 over its limit, 400 for malformed or unsigned bodies of any type`, async () => {
      const huge = await pastTheGuard(e, (h) => ({
        headers: { ...h, 'content-type': 'application/json' },
        body: JSON.stringify({ pad: 'x'.repeat(600 * 1024) }),
      }));
      expect(huge.res.status).toBe(413);
      const malformed = await pastTheGuard(e, (h) => ({ headers: { ...h, 'content-type': 'application/json' }, body: '{"id": "evt_1",' }));
      expect(malformed.res.status).toBe(400);
      const wrongType = await pastTheGuard(e, (h) => ({
        headers: { ...h, 'content-type': 'text/plain' },
        body: serialize(fc.sample(deepNesting, 1)[0]!).text,
      }));
      expect(wrongType.res.status).toBe(400);
    });
  }
});
