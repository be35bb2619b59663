import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';

const PASSWORD = 'demo-password-1';
let app: TestApp;
/** A second server on the same database, configured for https: HSTS and Secure cookies. */
let httpsApp: TestApp;
let listingPath: string;

beforeAll(async () => {
  app = await startTestApp();
  // The test process has already read its configuration (and database) for the first app; the second one
  // shares that database, so only its server process sees the https origin.
  httpsApp = await startTestApp({ seed: false, env: { APP_ORIGIN: 'https://lightyard.example', DATABASE_URL: app.env.DATABASE_URL! } });
  const search = await (await fetch(`${app.origin}/search?q=mirror`)).text();
  listingPath = search.match(/href="(\/listings\/[^"?#]+)"/)![1]!;
});
afterAll(async () => {
  await httpsApp?.stop();
  await app?.stop();
});

/** Directive name → its sources. */
function directives(policy: string | null): Map<string, string[]> {
  expect(policy, 'a Content-Security-Policy header').toBeTruthy();
  const map = new Map<string, string[]>();
  for (const part of policy!.split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) map.set(name, sources);
  }
  return map;
}

const sha256 = (text: string) => `'sha256-${createHash('sha256').update(text).digest('base64')}'`;

function expectCommonHeaders(r: Response, https: boolean) {
  expect(r.headers.get('x-content-type-options')).toBe('nosniff');
  expect(r.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
  expect(r.headers.get('permissions-policy')).toMatch(/camera=\(\)/);
  expect(directives(r.headers.get('content-security-policy')).get('frame-ancestors')).toEqual(["'none'"]);
  if (https) expect(r.headers.get('strict-transport-security')).toMatch(/^max-age=\d{7,}/);
  else expect(r.headers.has('strict-transport-security')).toBe(false);
}

describe('security headers', () => {
  let signedIn: Client;
  beforeAll(async () => {
    signedIn = new Client(app.origin);
    expect((await signedIn.signIn('buyer@demo.lightyard.example', PASSWORD)).status).toBe(200);
  });

  const cases: [string, () => Promise<Response>, number, RegExp][] = [
    ['the home page', () => signedIn.get('/'), 200, /text\/html/],
    ['a listing page', () => signedIn.get(listingPath), 200, /text\/html/],
    ['an API answer', () => signedIn.get('/api/me'), 200, /application\/json/],
    ['an API error (anonymous)', () => new Client(app.origin).get('/api/me'), 401, /application\/json/],
    ['an unknown API path', () => signedIn.get('/api/no-such-route'), 404, /application\/json/],
    ['an API route called with a method it lacks', () => signedIn.request('PUT', '/api/me', {}), 405, /application\/json/],
    ['the 404 page', () => signedIn.get('/no-such-page'), 404, /text\/html/],
    ['the 403 page', () => signedIn.get('/admin'), 403, /text\/html/],
    ['a redirect', () => new Client(app.origin).get('/account'), 303, /.*/],
  ];
  test.each(cases)('%s carries every header (no HSTS over http)', async (_, send, status, type) => {
    const r = await send();
    expect(r.status).toBe(status);
    expect(r.headers.get('content-type') ?? '').toMatch(type);
    expectCommonHeaders(r, false);
  });

  // [path, signed in, has islands]
  const pages: [string, boolean, boolean][] = [
    ['/', false, false],
    ['/search?q=mirror', false, false],
    ['a listing page', false, true],
    ['/tools', false, true],
    ['/sign-in', false, true],
    ['/sign-up', false, true],
    ['/cart', true, true],
    ['/account', true, true],
  ];
  test.each(pages)(
    'the CSP of %s allows only its own scripts and styles: no unsafe-inline, every inline one hashed',
    async (path, signIn, islands) => {
      const r = await (signIn ? signedIn : new Client(app.origin)).get(path === 'a listing page' ? listingPath : path);
      expect(r.status).toBe(200);
      const html = await r.text();
      const csp = directives(r.headers.get('content-security-policy'));
      const storage = new URL(app.env.S3_ENDPOINT!).origin;
      expect(csp.get('default-src')).toEqual(["'self'"]);
      expect(csp.get('object-src')).toEqual(["'none'"]);
      expect(csp.get('base-uri')).toEqual(["'self'"]);
      expect(csp.get('form-action')).toEqual(["'self'"]);
      expect(csp.get('img-src')).toEqual(["'self'", 'data:', 'blob:', storage]);
      expect(csp.get('connect-src')).toEqual(["'self'", storage]);
      for (const name of ['script-src', 'style-src']) {
        const sources = csp.get(name)!;
        expect(sources[0]).toBe("'self'");
        for (const s of sources.slice(1)) expect(s, `${name} source`).toMatch(/^'sha256-[A-Za-z0-9+/]+=*'$/);
      }
      const inlineScripts = [...html.matchAll(/<script(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/g)].map((m) => m[1]!);
      if (islands) expect(inlineScripts.length, 'islands hydrate through inline scripts').toBeGreaterThan(0);
      for (const s of inlineScripts) expect(csp.get('script-src'), 'hash of an inline script').toContain(sha256(s));
      for (const [, s] of html.matchAll(/<style[^>]*>([\s\S]*?)<\/style>/g))
        expect(csp.get('style-src'), 'hash of an inline style').toContain(sha256(s!));
      // Server-rendered style attributes are allowed; inline event handlers (script attributes) are not.
      expect(csp.get('style-src-attr')).toEqual(["'unsafe-inline'"]);
      expect(csp.has('script-src-attr')).toBe(false);
      expect(csp.has('script-src-elem')).toBe(false);
      expect(csp.has('style-src-elem')).toBe(false);
    },
  );

  test('answers that are not pages allow nothing to load', async () => {
    const csp = directives((await signedIn.get('/api/me')).headers.get('content-security-policy'));
    expect(csp.get('default-src')).toEqual(["'none'"]);
    expect(csp.has('script-src')).toBe(false);
  });
});

describe('cross-origin form posts', () => {
  const forms: [string, string][] = [
    ['application/x-www-form-urlencoded', 'a=1'],
    ['multipart/form-data; boundary=x', '--x\r\nContent-Disposition: form-data; name="a"\r\n\r\n1\r\n--x--\r\n'],
    ['text/plain', 'a=1'],
  ];
  test.each(['/sign-out', '/api/auth/sign-out'])(
    'a post to %s from another site is refused, is no HTML page, and the session lives on',
    async (path) => {
      const c = new Client(app.origin);
      await c.signIn('seller@demo.lightyard.example', PASSWORD);
      for (const [type, body] of forms) {
        const r = await c.request('POST', path, body, { origin: 'https://evil.example', 'content-type': type });
        expect(r.status, type).toBe(403);
        expect(r.headers.get('content-type') ?? '').not.toMatch(/html/);
        expect(r.headers.getSetCookie()).toEqual([]);
        expect((await c.get('/api/me')).status).toBe(200);
      }
      // the same post from the app's own origin does sign out, so the refusal above is the origin check's
      const own = await c.request('POST', path, 'a=1', { 'content-type': 'application/x-www-form-urlencoded' });
      expect(own.status).toBeLessThan(400);
      expect((await c.get('/api/me')).status).toBe(401);
    },
  );

  test('a cross-site password change is refused and the old password still signs in', async () => {
    const c = new Client(app.origin);
    await c.signIn('moderator@demo.lightyard.example', PASSWORD);
    const body = new URLSearchParams({ currentPassword: PASSWORD, newPassword: 'taken-over-password' }).toString();
    const r = await c.request('POST', '/api/auth/change-password', body, {
      origin: 'https://evil.example',
      'content-type': 'application/x-www-form-urlencoded',
    });
    expect(r.status).toBe(403);
    expect((await new Client(app.origin).signIn('moderator@demo.lightyard.example', PASSWORD)).status).toBe(200);
  });
});

describe('with an https origin', () => {
  test('pages and API answers carry HSTS as well as the other headers', async () => {
    const c = new Client(httpsApp.origin);
    for (const [path, status] of [
      ['/', 200],
      ['/api/me', 401],
      ['/no-such-page', 404],
    ] as const) {
      const r = await c.get(path);
      expect(r.status, path).toBe(status);
      expectCommonHeaders(r, true);
    }
  });

  test('the session cookie is Secure, HttpOnly and SameSite=Lax, and so is the cookie that clears it', async () => {
    const c = new Client(httpsApp.origin);
    const signIn = await c.signIn('buyer@demo.lightyard.example', PASSWORD);
    expect(signIn.status).toBe(200);
    const cookie = signIn.headers.getSetCookie().find((s) => s.startsWith('ly_session='))!;
    expect(cookie).toMatch(/;\s*Secure/i);
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    expect(cookie).toMatch(/;\s*Path=\//i);
    const cleared = (await c.post('/api/auth/sign-out')).headers.getSetCookie().find((s) => s.startsWith('ly_session='))!;
    expect(cleared).toMatch(/^ly_session=;/);
    expect(cleared).toMatch(/;\s*Secure/i);
    expect(cleared).toMatch(/;\s*HttpOnly/i);
  });

  test('over http the same cookie is HttpOnly and SameSite=Lax but not Secure', async () => {
    const cookie = (await new Client(app.origin).signIn('buyer@demo.lightyard.example', PASSWORD)).headers
      .getSetCookie()
      .find((s) => s.startsWith('ly_session='))!;
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);
  });
});
