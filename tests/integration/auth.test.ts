import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';
import { linkIn, mailTo, waitForMail } from '../setup/mailbox';

const PASSWORD = 'demo-password-1';
let app: TestApp;

beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app?.stop();
});

const client = () => new Client(app.origin);
const tokenOf = (url: string) => new URL(url).searchParams.get('token')!;

describe('session and /api/me', () => {
  test('without a cookie /api/me answers 401 JSON', async () => {
    const r = await client().get('/api/me');
    expect(r.status).toBe(401);
    expect(r.headers.get('content-type')).toMatch(/application\/json/);
    expect((await r.json()).error.code).toBe('unauthenticated');
  });

  test('the demo buyer signs in; the cookie is HttpOnly and SameSite=Lax; /api/me lists the buyer role', async () => {
    const c = client();
    const r = await c.signIn('buyer@demo.lightyard.example', PASSWORD);
    expect(r.status).toBe(200);
    const cookie = r.headers.getSetCookie().find((s) => s.startsWith('ly_session='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // plain-http origin in tests; Secure is set for https origins
    const me = await c.get('/api/me');
    expect(me.status).toBe(200);
    const body = await me.json();
    expect(body.user.email).toBe('buyer@demo.lightyard.example');
    expect(body.user.roles).toContain('buyer');
    expect(body.user.labs.map((l: { name: string }) => l.name)).toContain('Aubertin Atom Interferometry Team');
  });

  test.each(['seller', 'seller2', 'moderator', 'admin'])('demo account %s signs in with the documented password', async (who) => {
    const r = await client().signIn(`${who}@demo.lightyard.example`, PASSWORD);
    expect(r.status).toBe(200);
  });

  test('sign-out invalidates the session on the server, not only the cookie', async () => {
    const c = client();
    await c.signIn('seller@demo.lightyard.example', PASSWORD);
    const stolen = new Client(app.origin);
    stolen.cookies = new Map(c.cookies);
    expect((await stolen.get('/api/me')).status).toBe(200);
    expect((await c.post('/api/auth/sign-out')).status).toBe(200);
    expect((await stolen.get('/api/me')).status).toBe(401);
  });

  test('each sign-in gets a new session id', async () => {
    const c = client();
    await c.signIn('seller2@demo.lightyard.example', PASSWORD);
    const first = c.cookies.get('ly_session');
    await c.signIn('seller2@demo.lightyard.example', PASSWORD);
    expect(c.cookies.get('ly_session')).not.toBe(first);
  });
});

describe('sign-up and e-mail verification', () => {
  test('a sign-up sends exactly one verification mail; the link verifies once', async () => {
    const email = 'new.person@lab.example';
    const c = client();
    const r = await c.post('/api/auth/sign-up', { email: 'New.Person@Lab.example', password: 'long-enough-pw', name: 'New Person' });
    expect(r.status).toBe(201);
    const mail = await waitForMail(app.mailDir, email, /Confirm your e-mail/);
    await new Promise((res) => setTimeout(res, 500));
    expect(await mailTo(app.mailDir, email)).toHaveLength(1);
    const token = tokenOf(linkIn(mail, '/verify'));

    // unverified: can sign in, cannot act as a seller
    expect((await c.signIn(email, 'long-enough-pw')).status).toBe(200);
    const me = await (await c.get('/api/me')).json();
    expect(me.user.emailVerified).toBe(false);
    const lab = await c.post('/api/labs', { name: 'Unverified Lab', institute: 'Somewhere', country: 'FR' });
    expect(lab.status).toBe(403);
    expect((await lab.json()).error.code).toBe('email_unverified');

    expect((await c.post('/api/auth/verify', { token })).status).toBe(200);
    expect((await c.post('/api/auth/verify', { token })).status).toBe(400);
    expect((await (await c.get('/api/me')).json()).user.emailVerified).toBe(true);
    const lab2 = await c.post('/api/labs', { name: 'Verified Lab', institute: 'Somewhere', country: 'fr' });
    expect(lab2.status).toBe(201);
    const roles = (await (await c.get('/api/me')).json()).user.roles;
    expect(roles).toContain('seller');
  });

  test('a second sign-up with the same address is a 409 with the field named', async () => {
    const r = await client().post('/api/auth/sign-up', { email: 'buyer@demo.lightyard.example', password: 'long-enough-pw', name: 'Dup' });
    expect(r.status).toBe(409);
    expect((await r.json()).error.fields.email).toBeTruthy();
  });

  test('bad input gets 400 with field messages, 415 for another content type, 400 for broken JSON, 413 when too large', async () => {
    const c = client();
    const bad = await c.post('/api/auth/sign-up', { email: 'nope', password: 'short', name: '' });
    expect(bad.status).toBe(400);
    const body = await bad.json();
    expect(Object.keys(body.error.fields).sort()).toEqual(['email', 'name', 'password']);
    expect((await c.request('POST', '/api/auth/sign-up', 'x', { 'content-type': 'text/csv' })).status).toBe(415);
    expect((await c.request('POST', '/api/auth/sign-up', '{"email":', { 'content-type': 'application/json' })).status).toBe(400);
    const huge = JSON.stringify({ email: 'a@b.example', password: 'x'.repeat(100_000), name: 'x' });
    expect((await c.request('POST', '/api/auth/sign-up', huge)).status).toBe(413);
  });
});

describe('sign-in throttling', () => {
  test('ten wrong passwords, then the eleventh try answers 429 with Retry-After; a wrong e-mail reads the same', async () => {
    const c = client();
    const wrongEmail = await c.signIn('nobody@nowhere.example', 'whatever-pw');
    const wrongPassword = await c.signIn('seller3@demo.lightyard.example', 'wrong-password');
    expect(wrongEmail.status).toBe(401);
    expect(wrongPassword.status).toBe(401);
    expect((await wrongEmail.json()).error).toEqual((await wrongPassword.json()).error);
    for (let i = 2; i <= 10; i++) expect((await c.signIn('seller3@demo.lightyard.example', 'wrong-password')).status).toBe(401);
    const eleventh = await c.signIn('seller3@demo.lightyard.example', PASSWORD);
    expect(eleventh.status).toBe(429);
    const retry = Number(eleventh.headers.get('retry-after'));
    expect(retry).toBeGreaterThan(800);
    expect(retry).toBeLessThanOrEqual(900);
    expect((await eleventh.json()).error.code).toBe('rate_limited');
    // the same address can still sign in to another account: one person does not lock out the institute
    expect((await c.signIn('member@demo.lightyard.example', PASSWORD)).status).toBe(200);
  });
});

describe('password reset and change', () => {
  test('reset by e-mail link: single use, old password stops working, sessions end', async () => {
    const email = 'member@demo.lightyard.example';
    const other = client();
    await other.signIn(email, PASSWORD);
    const c = client();
    expect((await c.post('/api/auth/reset-request', { email })).status).toBe(202);
    expect((await c.post('/api/auth/reset-request', { email: 'ghost@nowhere.example' })).status).toBe(202);
    const mail = await waitForMail(app.mailDir, email, /Reset your Lightyard password/);
    const token = tokenOf(linkIn(mail, '/reset-password'));
    expect((await c.post('/api/auth/reset', { token, password: 'a-brand-new-pw' })).status).toBe(200);
    expect((await c.post('/api/auth/reset', { token, password: 'another-new-pw' })).status).toBe(400);
    expect((await other.get('/api/me')).status).toBe(401);
    expect((await c.signIn(email, PASSWORD)).status).toBe(401);
    expect((await c.signIn(email, 'a-brand-new-pw')).status).toBe(200);
  });

  test('a reset link older than one hour is refused', async () => {
    const email = 'seller2@demo.lightyard.example';
    const c = client();
    await c.post('/api/auth/reset-request', { email });
    const mail = await waitForMail(app.mailDir, email, /Reset your Lightyard password/);
    const token = tokenOf(linkIn(mail, '/reset-password'));
    const { getClient } = await import('../../src/server/db/client');
    const { hashToken } = await import('../../src/server/auth/tokens');
    await getClient().execute({
      sql: 'UPDATE email_tokens SET expires_at = ? WHERE token_hash = ?',
      args: [Date.now() - 1, hashToken(token)],
    });
    const r = await c.post('/api/auth/reset', { token, password: 'too-late-pw-1' });
    expect(r.status).toBe(400);
    expect((await r.json()).error.code).toBe('invalid_token');
  });

  test('changing the password rotates the session and ends the others', async () => {
    const email = 'moderator@demo.lightyard.example';
    const c = client();
    const other = client();
    await c.signIn(email, PASSWORD);
    await other.signIn(email, PASSWORD);
    const before = c.cookies.get('ly_session');
    const wrong = await c.post('/api/auth/change-password', { currentPassword: 'nope', newPassword: 'changed-pw-123' });
    expect(wrong.status).toBe(400);
    const r = await c.post('/api/auth/change-password', { currentPassword: PASSWORD, newPassword: 'changed-pw-123' });
    expect(r.status).toBe(200);
    expect(c.cookies.get('ly_session')).not.toBe(before);
    expect((await c.get('/api/me')).status).toBe(200);
    expect((await other.get('/api/me')).status).toBe(401);
    const stale = client();
    stale.cookies.set('ly_session', before!);
    expect((await stale.get('/api/me')).status).toBe(401);
  });
});
