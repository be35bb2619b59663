import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';
import { waitForMail } from '../setup/mailbox';

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
  expect((await c.signIn(`${who}@demo.lightyard.example`, PASSWORD)).status).toBe(200);
  return c;
}

const mirror = (overrides: Record<string, unknown> = {}) => ({
  category: 'cavity-mirror',
  title: 'Matched pair of 780 nm supermirrors',
  description: 'Two mirrors from the same coating run.',
  condition: 'like-new',
  quantity: 2,
  priceCents: 180000,
  currency: 'EUR',
  shipsTo: ['EU', 'UK'],
  specs: {
    diameterMm: 7.75,
    substrate: 'fused silica',
    rocMm: 50,
    designWavelengthNm: 780,
    bandMinNm: 760,
    bandMaxNm: 800,
    transmissionPpm: { value: 2, tol: 0.5 },
    lossPpm: { value: 3, tol: 1 },
    aoiDeg: 0,
    roughnessNm: 0.1,
  },
  ...overrides,
});

describe('creating listings', () => {
  test('the cavity-mirror contract creates a draft; only sellers in a lab may create', async () => {
    const seller = await as('seller');
    const r = await seller.post('/api/listings', mirror());
    expect(r.status).toBe(201);
    const { id } = await r.json();
    expect(typeof id).toBe('string');
    const buyer = await as('buyer');
    expect((await buyer.post('/api/listings', mirror())).status).toBe(403);
    expect((await new Client(app.origin).post('/api/listings', mirror())).status).toBe(401);
  });

  test('bad specs answer 400 with the field path named', async () => {
    const seller = await as('seller');
    const r = await seller.post(
      '/api/listings',
      mirror({ specs: { ...mirror().specs, transmissionPpm: { value: 999_000 }, lossPpm: { value: 2000 } } }),
    );
    expect(r.status).toBe(400);
    const body = await r.json();
    expect(Object.keys(body.error.fields).some((k) => k.startsWith('specs.'))).toBe(true);
    const band = await seller.post('/api/listings', mirror({ specs: { ...mirror().specs, designWavelengthNm: 1064 } }));
    expect(band.status).toBe(400);
    const wrongCurrency = await seller.post('/api/listings', mirror({ currency: 'euro' }));
    expect((await wrongCurrency.json()).error.fields.currency).toBeTruthy();
  });

  test('an unverified account cannot create listings', async () => {
    const c = new Client(app.origin);
    await c.post('/api/auth/sign-up', { email: 'unverified.seller@lab.example', password: 'long-enough-pw', name: 'U' });
    await c.signIn('unverified.seller@lab.example', 'long-enough-pw');
    const r = await c.post('/api/listings', mirror());
    expect(r.status).toBe(403);
    expect((await r.json()).error.code).toBe('email_unverified');
  });
});

describe('lifecycle', () => {
  test('draft → in review → live; edits of specs go back to review while the approved version stays visible', async () => {
    const seller = await as('seller');
    const anon = new Client(app.origin);
    const { id } = await (await seller.post('/api/listings', mirror())).json();
    expect((await anon.get(`/api/listings/${id}`)).status).toBe(404);

    const submitted = await seller.post(`/api/listings/${id}/submit`);
    expect((await submitted.json()).listing.status).toBe('in-review');

    const buyer = await as('buyer');
    expect((await buyer.post(`/api/moderation/listings/${id}`, { action: 'approve' })).status).toBe(403);
    const mod = await as('moderator');
    const approved = await mod.post(`/api/moderation/listings/${id}`, { action: 'approve' });
    expect((await approved.json()).listing.status).toBe('live');
    await waitForMail(app.mailDir, 'seller@demo.lightyard.example', /^Live: Matched pair/);

    const pub = await (await anon.get(`/api/listings/${id}`)).json();
    expect(pub.listing.priceCents).toBe(180000);
    expect(pub.working).toBeUndefined();

    expect((await buyer.request('PATCH', `/api/listings/${id}`, { priceCents: 1 })).status).toBe(403);
    const seller2 = await as('seller2');
    expect((await seller2.request('PATCH', `/api/listings/${id}`, { priceCents: 1 })).status).toBe(403);

    const edit = await seller.request('PATCH', `/api/listings/${id}`, { priceCents: 150000 });
    expect(edit.status).toBe(200);
    expect((await edit.json()).listing.status).toBe('in-review');
    const stillOld = await (await anon.get(`/api/listings/${id}`)).json();
    expect(stillOld.listing.priceCents).toBe(180000);

    const noReason = await mod.post(`/api/moderation/listings/${id}`, { action: 'request-changes' });
    expect(noReason.status).toBe(400);
    const changes = await mod.post(`/api/moderation/listings/${id}`, {
      action: 'request-changes',
      reason: 'Add the ring-down trace you mention.',
    });
    expect((await changes.json()).listing.status).toBe('changes-requested');
    const mail = await waitForMail(app.mailDir, 'member@demo.lightyard.example', /^Changes requested/);
    expect(mail.text).toContain('Add the ring-down trace you mention.');
    expect((await (await anon.get(`/api/listings/${id}`)).json()).listing.priceCents).toBe(180000);

    await seller.post(`/api/listings/${id}/submit`);
    await mod.post(`/api/moderation/listings/${id}`, { action: 'approve' });
    expect((await (await anon.get(`/api/listings/${id}`)).json()).listing.priceCents).toBe(150000);

    const stock = await seller.request('PATCH', `/api/listings/${id}`, { quantity: 0 });
    expect((await stock.json()).listing.status).toBe('sold-out');
    expect((await (await anon.get(`/api/listings/${id}`)).json()).listing.status).toBe('sold-out');

    expect((await seller.del(`/api/listings/${id}`)).status).toBe(200);
    expect((await anon.get(`/api/listings/${id}`)).status).toBe(404);
    expect((await seller.request('PATCH', `/api/listings/${id}`, { quantity: 3 })).status).toBe(409);

    const { getClient } = await import('../../src/server/db/client');
    const log = await getClient().execute({ sql: 'SELECT action FROM audit_log WHERE subject_id = ? ORDER BY id', args: [id] });
    expect(log.rows.map((r) => r.action)).toEqual([
      'listing.created',
      'listing.submitted',
      'moderation.approve',
      'listing.updated',
      'moderation.request-changes',
      'listing.submitted',
      'moderation.approve',
      'listing.updated',
      'listing.archived',
    ]);
  });

  test('a stale version is refused with 409 and changes nothing', async () => {
    const seller = await as('seller');
    const { id, listing } = await (await seller.post('/api/listings', mirror())).json();
    expect(
      (await seller.request('PATCH', `/api/listings/${id}`, { title: 'First edit of this title', version: listing.version })).status,
    ).toBe(200);
    const stale = await seller.request('PATCH', `/api/listings/${id}`, { title: 'Second edit of this title', version: listing.version });
    expect(stale.status).toBe(409);
    const now = await (await seller.get(`/api/listings/${id}`)).json();
    expect(now.working.title).toBe('First edit of this title');
  });

  test('?mine=1 lists the lab’s own listings in every status; the public list only live ones', async () => {
    const member = await as('member');
    const { id } = await (await member.post('/api/listings', mirror({ title: 'Draft only mirror' }))).json();
    const mine = await (await member.get('/api/listings?mine=1&limit=100')).json();
    expect(mine.items.map((l: { id: string }) => l.id)).toContain(id);
    const pub = await (await new Client(app.origin).get('/api/listings?limit=100')).json();
    expect(pub.items.map((l: { id: string }) => l.id)).not.toContain(id);
  });
});

describe('fit API', () => {
  test('POST /api/fit/cavity evaluates a pair against a finesse goal without signing in', async () => {
    // physics.md 1.3 (Hecht, Optics 2017): 2 + 3 ppm per mirror → ℱ ≈ 2π/10 ppm ≈ 628 000
    const r = await new Client(app.origin).post('/api/fit/cavity', {
      goal: { wavelengthNm: 780, lengthM: 0.05, target: { kind: 'finesse', value: 300000 }, configuration: 'pair' },
      mirrorA: mirror().specs,
    });
    expect(r.status).toBe(200);
    const { result } = await r.json();
    expect(result.finesse.nominal).toBeGreaterThan(6.2e5);
    expect(result.finesse.nominal).toBeLessThan(6.3e5);
    expect(result.verdict).toBe('fits');
    expect(result.source).toBeTruthy();
  });

  test('an unstable geometry is a result with a reason, bad input a 400, a formula domain error a 422', async () => {
    const anon = new Client(app.origin);
    const modes = await (await anon.post('/api/fit/modes', { lengthM: 0.25, roc1M: 0.1, roc2M: 0.1, wavelengthM: 1.064e-6 })).json();
    expect(modes.result.stable).toBe(false);
    expect(modes.source).toMatch(/Kogelnik/);
    expect((await anon.post('/api/fit/modes', { lengthM: -1, roc1M: 1, roc2M: 1, wavelengthM: 1e-6 })).status).toBe(400);
    expect((await anon.post('/api/fit/nothing', {})).status).toBe(404);
  });
});

describe('questions and reports', () => {
  test('a buyer’s question reaches the lab by e-mail, the lab answers in the app, others cannot read the thread', async () => {
    const seller = await as('seller');
    const { id } = await (await seller.post('/api/listings', mirror({ title: 'Mirror with questions' }))).json();
    await seller.post(`/api/listings/${id}/submit`);
    await (await as('moderator')).post(`/api/moderation/listings/${id}`, { action: 'approve' });

    const buyer = await as('buyer');
    const asked = await buyer.post(`/api/listings/${id}/questions`, { body: 'Was the ring-down measured at 780 nm?' });
    expect(asked.status).toBe(201);
    const { threadId } = await asked.json();
    const toLab = await waitForMail(app.mailDir, 'member@demo.lightyard.example', /^Question about Mirror with questions/);
    expect(toLab.text).toContain('Was the ring-down measured at 780 nm?');
    expect(toLab.text).toContain(`/messages/${threadId}`);

    const member = await as('member');
    expect((await member.post(`/api/threads/${threadId}/messages`, { body: 'Yes, at 780.2 nm in a 5 cm cavity.' })).status).toBe(201);
    await waitForMail(app.mailDir, 'buyer@demo.lightyard.example', /^Answer about Mirror with questions/);
    const thread = await (await buyer.get(`/api/threads/${threadId}/messages`)).json();
    expect(thread.messages.map((m: { body: string }) => m.body)).toEqual([
      'Was the ring-down measured at 780 nm?',
      'Yes, at 780.2 nm in a 5 cm cavity.',
    ]);
    expect((await (await as('seller2')).get(`/api/threads/${threadId}/messages`)).status).toBe(403);
    expect((await seller.post(`/api/listings/${id}/questions`, { body: 'Asking myself' })).status).toBe(409);
  });

  test('a report reaches the moderators’ queue and can be resolved', async () => {
    const pub = await (await new Client(app.origin).get('/api/listings?limit=1')).json();
    const listingId = pub.items[0].id;
    const buyer = await as('buyer');
    const r = await buyer.post(`/api/listings/${listingId}/reports`, { reason: 'The photo shows a different part.' });
    expect(r.status).toBe(201);
    const { id } = await r.json();
    const mod = await as('moderator');
    const page = await (await mod.get('/moderation')).text();
    expect(page).toContain('The photo shows a different part.');
    expect((await buyer.post(`/api/moderation/reports/${id}/resolve`)).status).toBe(403);
    expect((await mod.post(`/api/moderation/reports/${id}/resolve`)).status).toBe(200);
    expect(await (await mod.get('/moderation')).text()).not.toContain('The photo shows a different part.');
  });
});
