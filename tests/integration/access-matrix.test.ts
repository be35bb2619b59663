import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startTestApp, type TestApp } from '../setup/app';
import { discoverRoutes, routeKey } from '../setup/routes';
import { buildWorld, ROLE_LABELS, ROLES, type World } from '../setup/world';
import { MATRIX, type Row, type Status } from './access-matrix';

let app: TestApp;
let w: World;
const routes = discoverRoutes();

beforeAll(async () => {
  app = await startTestApp();
  w = await buildWorld(app);
}, 180_000);
afterAll(async () => {
  await app?.stop();
});

const label = (r: Row) =>
  `${r.send && r.send !== r.method ? `${r.method}(${r.send})` : r.method} ${r.route}${r.case ? ` [${r.case}]` : ''}`;
const matches = (expected: Status, got: number) => (typeof expected === 'number' ? got === expected : expected.includes(got));
const show = (s: Status) => (typeof s === 'number' ? String(s) : s.join('|'));

/** What else must hold besides the status: the API answers JSON (errors in the error shape), pages send anonymous visitors to sign-in. */
function shapeProblem(pathname: string, method: string, res: Response, text: string, anonymous: boolean): string | null {
  const type = res.headers.get('content-type') ?? '';
  if (pathname.startsWith('/api/')) {
    if (res.status >= 300 && res.status < 400) return res.headers.get('location') ? null : 'a redirect without a location';
    if (!type.startsWith('application/json')) return `content-type ${type || 'none'} from the API`;
    if (res.status < 400) return null;
    const body = JSON.parse(text) as { error?: { code?: unknown; message?: unknown } };
    const keys = Object.keys(body);
    if (keys.length !== 1 || typeof body.error?.code !== 'string' || typeof body.error?.message !== 'string')
      return `not the error shape: ${text.slice(0, 200)}`;
    return null;
  }
  if (
    res.status === 303 &&
    anonymous &&
    method === 'GET' &&
    !res.headers.get('location')?.startsWith(`/sign-in?next=${encodeURIComponent(pathname)}`)
  ) {
    return `redirected to ${res.headers.get('location')}, not to sign-in and back`;
  }
  if ((res.status === 403 || res.status === 404 || res.status === 200) && !type.startsWith('text/html'))
    return `content-type ${type || 'none'} for a page`;
  return null;
}

describe('access-control matrix', () => {
  test('every route in src/pages has a row, and every row names a route that exists', () => {
    const discovered = routes.flatMap((r) => r.handlers.map((h) => routeKey(h.method, r.pattern)));
    const tabled = new Set(MATRIX.map((r) => routeKey(r.method, r.route)));
    expect(
      routes.filter((r) => r.handlers.length === 0).map((r) => r.file),
      'route files that export no handler',
    ).toEqual([]);
    expect(
      discovered.filter((k) => !tabled.has(k)),
      'routes without a row in tests/integration/access-matrix.ts',
    ).toEqual([]);
    expect(
      [...tabled].filter((k) => !discovered.includes(k)),
      'rows for routes that no longer exist',
    ).toEqual([]);
  });

  test('every role gets the expected status from every row', async () => {
    const started = Date.now();
    const walk = [...MATRIX.filter((r) => !r.last), ...MATRIX.filter((r) => r.last)];
    const failures: string[] = [];
    const seen: Record<string, number[]> = {};
    for (const r of walk) {
      seen[label(r)] = [];
      for (const [i, role] of ROLES.entries()) {
        const req = await r.request(w, role);
        const client = req.ownSession ? await w.session(role) : w.client[role];
        const method = r.send ?? r.method;
        const res = await client.request(method, req.path, req.body, req.headers);
        const text = await res.text();
        seen[label(r)]!.push(res.status);
        const expected = r.expect[i]!;
        const pathname = new URL(req.path, app.origin).pathname;
        if (!matches(expected, res.status))
          failures.push(`${label(r)} as ${ROLE_LABELS[role]}: expected ${show(expected)}, got ${res.status} ${text.slice(0, 200)}`);
        else {
          const problem = shapeProblem(pathname, method, res, text, role === 'anonymous');
          if (problem) failures.push(`${label(r)} as ${ROLE_LABELS[role]}: ${problem}`);
        }
        if (r.endsSessions && role !== 'anonymous') await w.renewSession(role);
      }
    }
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    const keys = new Set(MATRIX.map((r) => routeKey(r.method, r.route)));
    const api = [...keys].filter((k) => k.split(' ')[1]!.startsWith('/api')).length;
    const width = Math.max(...Object.keys(seen).map((k) => k.length));
    console.log(
      [
        `Access matrix: ${keys.size} routes (${api} API, ${keys.size - api} pages) × ${ROLES.length} roles; ${MATRIX.length} rows, ${MATRIX.length * ROLES.length} requests checked in ${seconds} s; ${failures.length} unexpected`,
        `${'route'.padEnd(width)}  ${ROLES.map((r) => r.slice(0, 5).padStart(5)).join(' ')}`,
        ...Object.entries(seen).map(([k, statuses]) => `${k.padEnd(width)}  ${statuses.map((s) => String(s).padStart(5)).join(' ')}`),
      ].join('\n'),
    );
    expect(failures).toEqual([]);
  }, 600_000);

  test('a method an API route lacks answers JSON: 405, or 401 to anonymous callers of a non-public route', async () => {
    const tried: string[] = [];
    const wrong: string[] = [];
    for (const r of routes.filter((r) => r.kind === 'api' && !r.handlers.some((h) => h.method === 'ALL'))) {
      const path = r.pattern.replace(/\[\.\.\.[^\]]+\]/g, 'a/b').replace(/\[[^\]]+\]/g, 'some-id');
      const lacking = (['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const).filter((m) => !r.handlers.some((h) => h.method === m));
      for (const method of lacking) {
        for (const role of ['anonymous', 'buyer'] as const) {
          const res = await w.client[role].request(method, path, method === 'GET' ? undefined : {});
          const text = await res.text();
          tried.push(`${method} ${r.pattern}`);
          const allowed = role === 'anonymous' ? [401, 405] : [405];
          const problem = allowed.includes(res.status)
            ? shapeProblem(path, method, res, text, role === 'anonymous')
            : `status ${res.status}`;
          if (problem) wrong.push(`${method} ${r.pattern} as ${role}: ${problem}`);
        }
      }
    }
    console.log(`Methods a route lacks: ${tried.length} requests over ${new Set(tried).size} method × route pairs, ${wrong.length} wrong`);
    expect(wrong).toEqual([]);
  }, 120_000);
});
