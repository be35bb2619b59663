import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';
import { completeOnboarding, payWithCard, until } from '../setup/provider';
import { mirrorListing } from '../setup/listing-bodies';

const PASSWORD = 'demo-password-1';
let app: TestApp;

beforeAll(async () => {
  // a short hold and a fast job, so expiry can be seen within the test
  app = await startTestApp({ env: { RESERVATION_SECONDS: '3', JOBS_INTERVAL_MS: '500' } });
});
afterAll(async () => {
  await app?.stop();
});

async function as(who: string): Promise<Client> {
  const c = new Client(app.origin);
  expect((await c.signIn(`${who}@demo.lightyard.example`, PASSWORD)).status).toBe(200);
  return c;
}

async function newBuyer(i: number): Promise<Client> {
  const email = `buyer${i}.${Date.now()}@lab.example`;
  const c = new Client(app.origin);
  await c.post('/api/auth/sign-up', { email, password: 'buyer-password-1', name: `Buyer ${i}` });
  const { getClient } = await import('../../src/server/db/client');
  await getClient().execute({ sql: 'UPDATE users SET email_verified_at = ? WHERE email = ?', args: [Date.now(), email] });
  await c.signIn(email, 'buyer-password-1');
  return c;
}

const mirror = (quantity: number, title: string) =>
  mirrorListing(title, { quantity, priceCents: 100_000, description: 'For checkout tests.' });

async function liveListing(quantity: number, title: string): Promise<string> {
  const seller = await as('seller2');
  const { id } = await (await seller.post('/api/listings', mirror(quantity, title))).json();
  await seller.post(`/api/listings/${id}/submit`);
  const mod = await as('moderator');
  expect((await mod.post(`/api/moderation/listings/${id}`, { action: 'approve' })).status).toBe(200);
  return id;
}

async function quantityOf(id: string): Promise<number> {
  const { getClient } = await import('../../src/server/db/client');
  const r = await getClient().execute({ sql: 'SELECT quantity FROM listings WHERE id = ?', args: [id] });
  return Number(r.rows[0]!.quantity);
}

async function orderStatus(id: string): Promise<string> {
  const { getClient } = await import('../../src/server/db/client');
  const r = await getClient().execute({ sql: 'SELECT status FROM orders WHERE id = ?', args: [id] });
  return String(r.rows[0]!.status);
}

describe('checkout through the payment fake', () => {
  test('buy, pay, ship, confirm: the lab gets a transfer of the price minus 8 % and a payout that turns paid', async () => {
    const seller = await as('seller2');
    const onboarding = await seller.post('/api/payouts/onboarding', {});
    expect(onboarding.status).toBe(200);
    await completeOnboarding((await onboarding.json()).url);
    await until('the account.updated webhook', async () => (await (await seller.get('/api/payouts')).json()).account?.payoutsEnabled);

    const listingId = await liveListing(2, 'Checkout mirror pair');
    const buyer = await as('buyer');
    expect((await buyer.post('/api/cart/items', { listingId, quantity: 2 })).status).toBe(201);
    const co = await buyer.post('/api/checkout', {});
    expect(co.status).toBe(201);
    const { orderIds, checkoutUrl, sessionId } = await co.json();
    expect(orderIds).toHaveLength(1);
    expect(checkoutUrl).toContain(sessionId);
    expect(await quantityOf(listingId)).toBe(0);

    const paid = await payWithCard(app, sessionId, '4242424242424242');
    expect(paid.status).toBe(200);
    await until('the order to be paid', async () => (await orderStatus(orderIds[0])) === 'paid');

    expect((await buyer.post(`/api/orders/${orderIds[0]}/ship`, { carrier: 'Post', trackingNumber: 'LY123' })).status).toBe(403);
    const shipped = await seller.post(`/api/orders/${orderIds[0]}/ship`, { carrier: 'Lab courier', trackingNumber: 'LY-0001' });
    expect((await shipped.json()).order.status).toBe('shipped');
    const confirmed = await buyer.post(`/api/orders/${orderIds[0]}/confirm-receipt`, {});
    expect((await confirmed.json()).order.status).toBe('completed');

    const view = await until('a paid payout', async () => {
      const v = await (await seller.get('/api/payouts')).json();
      return v.payouts.some((p: { status: string }) => p.status === 'paid') && v;
    });
    expect(view.transfers).toHaveLength(1);
    expect(view.transfers[0].amountCents).toBe(200_000 - 16_000);
  });

  test('20 concurrent checkouts of a single unit: one order is paid, the rest get 409 sold out, stock never below 0', async () => {
    const listingId = await liveListing(1, 'Only one of these');
    const buyers = await Promise.all(Array.from({ length: 20 }, (_, i) => newBuyer(i)));
    for (const b of buyers) expect((await b.post('/api/cart/items', { listingId, quantity: 1 })).status).toBe(201);
    const results = await Promise.all(buyers.map((b) => b.post('/api/checkout', {})));
    const codes = results.map((r) => r.status).sort();
    expect(codes.filter((c) => c === 201)).toHaveLength(1);
    expect(codes.filter((c) => c === 409)).toHaveLength(19);
    const refused = await results.find((r) => r.status === 409)!.json();
    expect(refused.error.message).toMatch(/sold out/);
    expect(await quantityOf(listingId)).toBe(0);
    const { sessionId, orderIds } = await results.find((r) => r.status === 201)!.json();
    await payWithCard(app, sessionId, '4242424242424242');
    await until('paid', async () => (await orderStatus(orderIds[0])) === 'paid');
    expect(await quantityOf(listingId)).toBe(0);
  });

  test('the same signed event delivered five times changes the order once; a bad signature changes nothing', async () => {
    const listingId = await liveListing(1, 'Event replay mirror');
    const buyer = await newBuyer(100);
    await buyer.post('/api/cart/items', { listingId, quantity: 1 });
    const { orderIds, sessionId } = await (await buyer.post('/api/checkout', {})).json();
    const { getClient } = await import('../../src/server/db/client');
    const [checkoutId] = (await getClient().execute({ sql: 'SELECT checkout_id FROM orders WHERE id = ?', args: [orderIds[0]] })).rows.map(
      (r) => String(r.checkout_id),
    );
    const event = {
      id: `evt_replay_${Date.now()}`,
      object: 'event',
      type: 'checkout.session.completed',
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      data: {
        object: {
          id: sessionId,
          object: 'checkout.session',
          payment_status: 'paid',
          status: 'complete',
          payment_intent: 'pi_replayed',
          metadata: { checkoutId },
          client_reference_id: checkoutId,
        },
      },
    };
    const payload = JSON.stringify(event);
    const stripe = new Stripe('sk_test_x');
    const bad = await fetch(`${app.origin}/api/webhooks/stripe`, {
      method: 'POST',
      headers: {
        'content-type': 'application/json',
        'stripe-signature': stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_wrong' }),
      },
      body: payload,
    });
    expect(bad.status).toBe(400);
    expect(await orderStatus(orderIds[0])).toBe('pending_payment');
    const answers = [];
    for (let i = 0; i < 5; i++) {
      const header = stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_test' });
      answers.push(
        await (
          await fetch(`${app.origin}/api/webhooks/stripe`, {
            method: 'POST',
            headers: { 'content-type': 'application/json', 'stripe-signature': header },
            body: payload,
          })
        ).json(),
      );
    }
    expect(answers.map((a) => a.duplicate)).toEqual([false, true, true, true, true]);
    expect(await orderStatus(orderIds[0])).toBe('paid');
    const log = await getClient().execute({
      sql: "SELECT count(*) AS n FROM audit_log WHERE subject_id = ? AND action = 'order.paid'",
      args: [orderIds[0]],
    });
    expect(Number(log.rows[0]!.n)).toBe(1);
  });

  test('a declined card leaves the order unpaid, and the stock is back once the reservation expires', async () => {
    const listingId = await liveListing(1, 'Declined card mirror');
    const buyer = await newBuyer(200);
    await buyer.post('/api/cart/items', { listingId, quantity: 1 });
    const { orderIds, sessionId } = await (await buyer.post('/api/checkout', {})).json();
    expect(await quantityOf(listingId)).toBe(0);
    const declined = await payWithCard(app, sessionId, '4000000000000002');
    expect(declined.body.status).toBe('open');
    expect(declined.body.payment_status).toBe('unpaid');
    expect(await orderStatus(orderIds[0])).toBe('pending_payment');
    await until('the reservation to be released', async () => (await quantityOf(listingId)) === 1, 20_000);
    expect(await orderStatus(orderIds[0])).toBe('cancelled');
    const pub = await (await new Client(app.origin).get(`/api/listings/${listingId}`)).json();
    expect(pub.listing.status).toBe('live');
  });

  test('refunds: the buyer asks, a moderator refunds part and then the rest; the provider is charged back each time', async () => {
    const listingId = await liveListing(1, 'Refund mirror');
    const buyer = await newBuyer(300);
    await buyer.post('/api/cart/items', { listingId, quantity: 1 });
    const { orderIds, sessionId } = await (await buyer.post('/api/checkout', {})).json();
    await payWithCard(app, sessionId, '4242424242424242');
    await until('paid', async () => (await orderStatus(orderIds[0])) === 'paid');
    const asked = await buyer.post(`/api/orders/${orderIds[0]}/refund`, { reason: 'The coating shows a scratch.' });
    expect((await asked.json()).order.status).toBe('refund_requested');
    const seller = await as('seller2');
    expect((await seller.post(`/api/orders/${orderIds[0]}/refund`, { reason: 'Trying to refund myself' })).status).toBe(403);
    const mod = await as('moderator');
    const tooMuch = await mod.post(`/api/orders/${orderIds[0]}/refund`, { amountCents: 100_001, reason: 'Too much' });
    expect(tooMuch.status).toBe(400);
    const part = await (
      await mod.post(`/api/orders/${orderIds[0]}/refund`, { amountCents: 30_000, reason: 'Partial refund for the scratch' })
    ).json();
    expect(part.order.status).toBe('paid');
    expect(part.order.refundedCents).toBe(30_000);
    const rest = await (await mod.post(`/api/orders/${orderIds[0]}/refund`, { reason: 'Returned after all' })).json();
    expect(rest.order.status).toBe('refunded');
    expect(rest.order.refundedCents).toBe(100_000);
    const { default: StripeSdk } = await import('stripe');
    const provider = new StripeSdk('sk_test_lightyard_fake', { host: '127.0.0.1', port: app.fakes.ports.stripe, protocol: 'http' });
    const pi = (await provider.checkout.sessions.retrieve(sessionId)).payment_intent as string;
    const refunds = await provider.refunds.list({ payment_intent: pi });
    expect(refunds.data.map((r) => r.amount).sort((a, b) => a - b)).toEqual([30_000, 70_000]);
  });

  test('an unverified account cannot check out', async () => {
    const c = new Client(app.origin);
    await c.post('/api/auth/sign-up', { email: 'not.yet.verified@lab.example', password: 'long-enough-pw', name: 'Not Yet' });
    await c.signIn('not.yet.verified@lab.example', 'long-enough-pw');
    const r = await c.post('/api/checkout', {});
    expect(r.status).toBe(403);
    expect((await r.json()).error.code).toBe('email_unverified');
  });

  test('ships-to and export control are checked before any stock is held', async () => {
    const seller = await as('seller3');
    const { id } = await (await seller.post('/api/listings', { ...mirror(1, 'UK only mirror'), shipsTo: ['UK'] })).json();
    await seller.post(`/api/listings/${id}/submit`);
    await (await as('moderator')).post(`/api/moderation/listings/${id}`, { action: 'approve' });
    const buyer = await as('buyer');
    await buyer.post('/api/cart/items', { listingId: id, quantity: 1 });
    const r = await buyer.post('/api/checkout', { shipTo: 'CA' });
    expect(r.status).toBe(422);
    expect((await r.json()).error.message).toMatch(/does not ship to CA/);
    expect(await quantityOf(id)).toBe(1);
  });
});
