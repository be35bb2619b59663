import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';
import { linkIn, waitForMail } from '../setup/mailbox';

const PASSWORD = 'demo-password-1';
let app: TestApp;

beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app?.stop();
});

async function as(who: string): Promise<Client> {
  const c = new Client(app.origin);
  const r = await c.signIn(`${who}@demo.lightyard.example`, PASSWORD);
  expect(r.status).toBe(200);
  return c;
}

async function userId(c: Client): Promise<string> {
  return (await (await c.get('/api/me')).json()).user.id;
}

describe('API answers JSON, never HTML', () => {
  test('an unknown /api path: 401 without a session, 404 with one', async () => {
    const anon = new Client(app.origin);
    const r = await anon.get('/api/no-such-thing');
    expect(r.status).toBe(401);
    expect(r.headers.get('content-type')).toMatch(/json/);
    const buyer = await as('buyer');
    const r2 = await buyer.get('/api/no-such-thing');
    expect(r2.status).toBe(404);
    expect((await r2.json()).error.code).toBe('not_found');
  });

  test('a known route with a method it lacks: 405 JSON (401 first when the route needs a session)', async () => {
    const anon = new Client(app.origin);
    const r = await anon.get('/api/auth/sign-in');
    expect(r.status).toBe(405);
    expect((await r.json()).error.code).toBe('method_not_allowed');
    const r2 = await anon.request('PUT', '/api/labs');
    expect(r2.status).toBe(401);
  });
});

describe('roles', () => {
  test('a buyer gets 403 JSON from the admin API; an admin grants and removes the seller role, and it is audited', async () => {
    const buyer = await as('buyer');
    const buyerId = await userId(buyer);
    const denied = await buyer.post(`/api/admin/users/${buyerId}/roles`, { role: 'seller' });
    expect(denied.status).toBe(403);
    expect((await denied.json()).error.code).toBe('forbidden');

    const admin = await as('admin');
    const list = await (await admin.get('/api/admin/users?q=buyer@demo')).json();
    expect(list.users.map((u: { email: string }) => u.email)).toEqual(['buyer@demo.lightyard.example']);
    expect((await admin.post(`/api/admin/users/${buyerId}/roles`, { role: 'seller' })).status).toBe(200);
    expect((await (await buyer.get('/api/me')).json()).user.roles).toEqual(['buyer', 'seller']);
    expect((await admin.del(`/api/admin/users/${buyerId}/roles/seller`)).status).toBe(200);
    expect((await (await buyer.get('/api/me')).json()).user.roles).toEqual(['buyer']);
    expect((await admin.post(`/api/admin/users/${buyerId}/roles`, { role: 'wizard' })).status).toBe(400);

    const { getClient } = await import('../../src/server/db/client');
    const rows = await getClient().execute({ sql: 'SELECT action FROM audit_log WHERE subject_id = ? ORDER BY id', args: [buyerId] });
    expect(rows.rows.map((r) => r.action)).toEqual(['role.granted', 'role.revoked']);
  });

  test('the last admin cannot lose the admin role', async () => {
    const admin = await as('admin');
    const id = await userId(admin);
    const r = await admin.del(`/api/admin/users/${id}/roles/admin`);
    expect(r.status).toBe(409);
  });
});

describe('labs and invitations', () => {
  test('an owner invites by e-mail; the invitee signs up, joins through the link and becomes a member', async () => {
    const owner = await as('seller');
    const me = await (await owner.get('/api/me')).json();
    const lab = me.user.labs[0];
    expect(lab.role).toBe('owner');

    const member = await as('member');
    const notOwner = await member.post(`/api/labs/${lab.slug}/invites`, { email: 'x@y.example' });
    expect(notOwner.status).toBe(403);
    const outsider = await as('seller2');
    expect((await outsider.get(`/api/labs/${lab.slug}`)).status).toBe(403);

    const email = 'postdoc@elsewhere.example';
    expect((await owner.post(`/api/labs/${lab.slug}/invites`, { email })).status).toBe(201);
    const mail = await waitForMail(app.mailDir, email, /Join Solvang Cavity QED Group/);
    const token = new URL(linkIn(mail, '/invites/accept')).searchParams.get('token')!;

    const wrongAccount = await outsider.post('/api/invites/accept', { token });
    expect(wrongAccount.status).toBe(403);

    const invitee = new Client(app.origin);
    expect((await invitee.post('/api/auth/sign-up', { email, password: 'postdoc-pass-1', name: 'Post Doc' })).status).toBe(201);
    await invitee.signIn(email, 'postdoc-pass-1');
    const joined = await invitee.post('/api/invites/accept', { token });
    expect(joined.status).toBe(200);
    const after = (await (await invitee.get('/api/me')).json()).user;
    expect(after.labs).toEqual([expect.objectContaining({ slug: lab.slug, role: 'member' })]);
    expect(after.roles).toContain('seller');
    expect((await invitee.post('/api/invites/accept', { token })).status).toBe(400);

    const detail = await (await owner.get(`/api/labs/${lab.slug}`)).json();
    expect(detail.members.map((m: { email: string }) => m.email)).toContain(email);
  });

  test('the owner removes a member; the last owner cannot be removed', async () => {
    const owner = await as('seller2');
    const me = await (await owner.get('/api/me')).json();
    const lab = me.user.labs[0];
    const r = await owner.del(`/api/labs/${lab.slug}/members/${me.user.id}`);
    expect(r.status).toBe(409);
  });
});

describe('pages', () => {
  test('a buyer opening /admin gets the 403 page; anonymous is sent to sign in', async () => {
    const buyer = await as('buyer');
    const r = await buyer.get('/admin');
    expect(r.status).toBe(403);
    expect(await r.text()).toMatch(/No access/);
    const anon = await new Client(app.origin).get('/admin');
    expect(anon.status).toBe(303);
    expect(anon.headers.get('location')).toBe('/sign-in?next=%2Fadmin');
  });

  test('no page loads anything from another host', async () => {
    const html = await (await new Client(app.origin).get('/')).text();
    const external = [...html.matchAll(/(?:src|href)="(https?:\/\/[^"]+)"/g)].map((m) => m[1]);
    expect(external).toEqual([]);
  });

  test('/dev/mail lists delivered mail while the fakes are configured', async () => {
    const r = await new Client(app.origin).get('/dev/mail');
    expect(r.status).toBe(200);
  });
});
