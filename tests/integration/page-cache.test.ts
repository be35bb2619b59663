import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';

const PASSWORD = 'demo-password-1';
let app: TestApp;
let seller: Client;
let id: string;

beforeAll(async () => {
  app = await startTestApp();
  seller = new Client(app.origin);
  expect((await seller.signIn('seller@demo.lightyard.example', PASSWORD)).status).toBe(200);
  const mine = await (await seller.get('/api/listings?mine=1&limit=100')).json();
  id = mine.items.find((l: { status: string }) => l.status === 'live').id;
});
afterAll(async () => {
  await app?.stop();
});

const anonymous = () => new Client(app.origin).get(`/listings/${id}`);
const available = (html: string) => html.match(/Available<\/dt><dd class="num">([^<]+)</)?.[1];

describe('listing pages for visitors without a session', () => {
  test('a second view is the same page with the same headers, CSP hashes included', async () => {
    const first = await anonymous();
    const second = await anonymous();
    expect(second.status).toBe(200);
    expect(await second.text()).toBe(await first.text());
    for (const h of ['content-type', 'content-security-policy', 'x-content-type-options', 'referrer-policy']) {
      expect(second.headers.get(h), h).toBe(first.headers.get(h));
    }
    expect(second.headers.get('content-security-policy')).toMatch(/script-src 'self' 'sha256-/);
  });

  test('a change to the listing shows at once', async () => {
    const before = await (await anonymous()).text();
    const { working } = await (await seller.get(`/api/listings/${id}`)).json();
    expect(available(before)).toBe(String(working.quantity));
    const patch = await seller.request('PATCH', `/api/listings/${id}`, { quantity: working.quantity + 3, version: working.version });
    expect(patch.status).toBe(200);
    expect(available(await (await anonymous()).text())).toBe(String(working.quantity + 3));
  });

  test('a signed-in visitor gets a page of their own, never the cached one', async () => {
    expect(await (await anonymous()).text()).toContain('to buy or to ask the lab a question');
    const buyer = new Client(app.origin);
    await buyer.signIn('buyer@demo.lightyard.example', PASSWORD);
    const own = await (await buyer.get(`/listings/${id}`)).text();
    expect(own).not.toContain('to buy or to ask the lab a question');
    expect(own).toContain('component-url="/_astro/AddToCart');
  });
});
