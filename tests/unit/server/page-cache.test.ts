import { describe, expect, test } from 'vitest';
import { notifyListingChanged } from '../../../src/server/listings/events';
import { cachedPage, pageCacheKey } from '../../../src/server/http/page-cache';

const html = (body: string, init: ResponseInit = {}) =>
  new Response(body, { status: 200, ...init, headers: { 'content-type': 'text/html', ...init.headers } });

function renderer(make: (n: number) => Response) {
  let calls = 0;
  return { render: async () => make(++calls), calls: () => calls };
}

describe('pageCacheKey', () => {
  const key = (method: string, path: string, session = false) =>
    pageCacheKey(new Request(`http://app.example${path}`, { method }), new URL(`http://app.example${path}`), session);

  test('only a GET of a listing page without a query string or a session', () => {
    expect(key('GET', '/listings/abc')).toBe('/listings/abc');
    expect(key('GET', '/listings/abc', true)).toBeNull();
    expect(key('GET', '/listings/abc?x=1')).toBeNull();
    expect(key('POST', '/listings/abc')).toBeNull();
    expect(key('GET', '/listings')).toBeNull();
    expect(key('GET', '/listings/abc/edit')).toBeNull();
    expect(key('GET', '/search')).toBeNull();
  });
});

describe('cachedPage', () => {
  test('renders once within the lifetime, again after it', async () => {
    let now = 1_000_000;
    const r = renderer((n) => html(`page ${n}`));
    expect(await (await cachedPage('/listings/ttl', r.render, () => now)).text()).toBe('page 1');
    now += 4_000;
    expect(await (await cachedPage('/listings/ttl', r.render, () => now)).text()).toBe('page 1');
    now += 2_000;
    expect(await (await cachedPage('/listings/ttl', r.render, () => now)).text()).toBe('page 2');
    expect(r.calls()).toBe(2);
  });

  test('a change to the listing drops its entry', async () => {
    const r = renderer((n) => html(`page ${n}`));
    await cachedPage('/listings/changed', r.render);
    notifyListingChanged('changed');
    expect(await (await cachedPage('/listings/changed', r.render)).text()).toBe('page 2');
  });

  test.each([
    ['a 404', () => html('gone', { status: 404 })],
    ['JSON', () => new Response('{}', { headers: { 'content-type': 'application/json' } })],
    ['an answer that sets a cookie', () => html('page', { headers: { 'set-cookie': 'a=1' } })],
  ])('%s is passed on and not kept', async (_, make) => {
    const r = renderer(make);
    const key = `/listings/${Math.random()}`;
    await cachedPage(key, r.render);
    await cachedPage(key, r.render);
    expect(r.calls()).toBe(2);
  });

  test('requests that miss together wait for one render; when it is not cacheable each renders its own', async () => {
    for (const [status, renders] of [
      [200, 1],
      [404, 3],
    ] as const) {
      let open: () => void = () => {};
      const gate = new Promise<void>((resolve) => (open = resolve));
      const r = renderer((n) => html(`page ${n}`, { status }));
      const slow = async () => {
        await gate;
        return r.render();
      };
      const answers = Promise.all([1, 2, 3].map(() => cachedPage(`/listings/together-${status}`, slow)));
      open();
      const bodies = await Promise.all((await answers).map((a) => a.text()));
      expect(r.calls(), `status ${status}`).toBe(renders);
      if (status === 200) expect(bodies).toEqual(['page 1', 'page 1', 'page 1']);
    }
  });

  test('a hit keeps the status and headers of the rendered page', async () => {
    const r = renderer(() => html('page', { headers: { 'content-security-policy': "script-src 'self' 'sha256-x'" } }));
    await cachedPage('/listings/headers', r.render);
    const hit = await cachedPage('/listings/headers', r.render);
    expect(r.calls()).toBe(1);
    expect(hit.status).toBe(200);
    expect(hit.headers.get('content-security-policy')).toBe("script-src 'self' 'sha256-x'");
  });
});
