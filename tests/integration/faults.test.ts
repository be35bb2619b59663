/**
 * Faults: the app killed mid-checkout, each outside service down and back on the same port, and the
 * database file held by another writer. The fakes this file takes down are its own, started on fixed
 * ports so the app finds them again when they come back.
 */
import { createClient } from '@libsql/client';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startMailFake } from '../../fakes/mail/server';
import { startS3Fake } from '../../fakes/s3/server';
import { loopbackOrigins } from '../../fakes/start';
import { startStripeFake } from '../../fakes/stripe/server';
import { Client, freePort, startTestApp, type TestApp } from '../setup/app';
import { mirrorListing } from '../setup/listing-bodies';
import { mailTo, waitForMail } from '../setup/mailbox';
import { until } from '../setup/provider';

const PASSWORD = 'demo-password-1';
const RESERVATION_SECONDS = 8;
const JOBS_INTERVAL_MS = 250;
/** How late the reconciliation job may release a lapsed hold: a few job intervals plus a provider round trip. */
const RELEASE_SLACK_MS = 2_500;

interface Restartable {
  port: number;
  down(): Promise<void>;
  up(): Promise<void>;
}

/** A fake that can go away and come back on the same port, with the state it keeps on disk. */
async function restartable(start: (port: number) => Promise<{ port: number; stop(): Promise<void> }>): Promise<Restartable> {
  let running: { port: number; stop(): Promise<void> } | null = await start(0);
  const port = running.port;
  return {
    port,
    async down() {
      await running?.stop();
      running = null;
    },
    async up() {
      running ??= await start(port);
    },
  };
}

/** Listens where the payment fake was and never answers, so a provider call hangs as on a stalled network. */
async function blackHole(port: number): Promise<{ arrived: Promise<IncomingMessage>; close(): Promise<void> }> {
  let arrive!: (req: IncomingMessage) => void;
  const arrived = new Promise<IncomingMessage>((r) => (arrive = r));
  const server: Server = createServer((req) => arrive(req));
  await new Promise<void>((r) => server.listen(port, '127.0.0.1', r));
  return {
    arrived,
    close: () =>
      new Promise<void>((r) => {
        server.closeAllConnections();
        server.close(() => r());
      }),
  };
}

let app: TestApp;
let work: string;
let stripeFake: Restartable;
let mailFake: Restartable;
let s3Fake: Restartable;
let provider: Stripe;
const mailDir = () => join(work, 'mail');

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), 'lightyard-faults-'));
  const port = await freePort();
  const origin = `http://127.0.0.1:${port}`;
  stripeFake = await restartable((p) =>
    startStripeFake({ port: p, dir: join(work, 'stripe'), webhookUrl: `${origin}/api/webhooks/stripe`, webhookSecret: 'whsec_test' }),
  );
  mailFake = await restartable((p) => startMailFake({ port: p, dir: mailDir() }));
  s3Fake = await restartable((p) =>
    startS3Fake({ port: p, dir: join(work, 's3'), bucket: 'lightyard', allowedOrigins: loopbackOrigins(origin) }),
  );
  app = await startTestApp({
    port,
    env: {
      STRIPE_API_BASE: `http://127.0.0.1:${stripeFake.port}`,
      SMTP_PORT: String(mailFake.port),
      S3_ENDPOINT: `http://127.0.0.1:${s3Fake.port}`,
      RESERVATION_SECONDS: String(RESERVATION_SECONDS),
      JOBS_INTERVAL_MS: String(JOBS_INTERVAL_MS),
      MAIL_RETRY_BASE_MS: '500',
    },
  });
  provider = new Stripe('sk_test_lightyard_fake', { host: '127.0.0.1', port: stripeFake.port, protocol: 'http', maxNetworkRetries: 0 });
});

afterAll(async () => {
  await app?.stop();
  for (const fake of [stripeFake, mailFake, s3Fake]) await fake?.down();
  if (work) rmSync(work, { recursive: true, force: true });
});

/** Pays on this file's payment fake as its hosted page would. */
async function pay(sessionId: string): Promise<number> {
  const r = await fetch(`http://127.0.0.1:${stripeFake.port}/_fake/checkout/sessions/${sessionId}/pay`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ card: '4242424242424242' }),
  });
  await r.body?.cancel();
  return r.status;
}

async function sql(query: string, args: (string | number)[] = []) {
  const { getClient } = await import('../../src/server/db/client');
  return (await getClient().execute({ sql: query, args })).rows;
}

async function as(who: string): Promise<Client> {
  const c = new Client(app.origin);
  expect((await c.signIn(`${who}@demo.lightyard.example`, PASSWORD)).status).toBe(200);
  return c;
}

let buyers = 0;
async function newBuyer(): Promise<{ client: Client; id: string; email: string }> {
  const email = `faults.buyer${++buyers}.${Date.now()}@lab.example`;
  const client = new Client(app.origin);
  expect((await client.post('/api/auth/sign-up', { email, password: 'buyer-password-1', name: `Buyer ${buyers}` })).status).toBe(201);
  await sql('UPDATE users SET email_verified_at = ? WHERE email = ?', [Date.now(), email]);
  expect((await client.signIn(email, 'buyer-password-1')).status).toBe(200);
  const [row] = await sql('SELECT id FROM users WHERE email = ?', [email]);
  return { client, id: String(row!.id), email };
}

const mirror = (quantity: number, title: string) => mirrorListing(title, { quantity, priceCents: 50_000, description: 'For fault tests.' });

async function liveListing(quantity: number, title: string): Promise<string> {
  const seller = await as('seller2');
  const created = await seller.post('/api/listings', mirror(quantity, title));
  expect(created.status).toBe(201);
  const { id } = await created.json();
  await seller.post(`/api/listings/${id}/submit`);
  expect((await (await as('moderator')).post(`/api/moderation/listings/${id}`, { action: 'approve' })).status).toBe(200);
  return id;
}

const quantityOf = async (listingId: string) => Number((await sql('SELECT quantity FROM listings WHERE id = ?', [listingId]))[0]!.quantity);
const orderOf = async (orderId: string) => (await sql('SELECT status, checkout_id FROM orders WHERE id = ?', [orderId]))[0]!;
const checkoutOf = async (checkoutId: string) =>
  (await sql('SELECT status, provider_session_id, reserved_until, released_at FROM checkouts WHERE id = ?', [checkoutId]))[0]!;
const paidEntries = async (orderId: string) =>
  Number((await sql("SELECT count(*) AS n FROM audit_log WHERE subject_id = ? AND action = 'order.paid'", [orderId]))[0]!.n);

async function integrity(): Promise<string[]> {
  return (await sql('PRAGMA integrity_check')).map((r) => String(r[0]));
}

/** Puts one listing in the buyer's cart and checks out; returns what the app answered and the checkout row's id. */
async function checkOut(buyer: Client, listingId: string) {
  expect((await buyer.post('/api/cart/items', { listingId, quantity: 1 })).status).toBe(201);
  const res = await buyer.post('/api/checkout', {});
  expect(res.status).toBe(201);
  const body = (await res.json()) as { orderIds: string[]; sessionId: string };
  const checkoutId = String((await orderOf(body.orderIds[0]!)).checkout_id);
  return { ...body, orderId: body.orderIds[0]!, checkoutId };
}

/** Waits until the checkout's hold is released and returns how long after the hold ran out that happened. */
async function releasedLate(checkoutId: string): Promise<number> {
  const row = await until(
    'the reservation to be released',
    async () => {
      const co = await checkoutOf(checkoutId);
      return co.released_at !== null && co;
    },
    (RESERVATION_SECONDS + 10) * 1000,
  );
  return Number(row.released_at) - Number(row.reserved_until);
}

describe('faults', () => {
  test('SIGKILL after the buyer paid but before the webhook landed: one order paid once, one charge; an unpaid hold is released on time', async () => {
    const paidListing = await liveListing(1, 'Killed-checkout mirror, paid');
    const unpaidListing = await liveListing(1, 'Killed-checkout mirror, abandoned');
    const payer = await newBuyer();
    const leaver = await newBuyer();
    const paid = await checkOut(payer.client, paidListing);
    const abandoned = await checkOut(leaver.client, unpaidListing);

    await app.kill('SIGKILL');
    // The fake's webhook delivery is refused while the app is down and retried with backoff.
    expect(await pay(paid.sessionId)).toBe(200);
    expect((await provider.checkout.sessions.retrieve(paid.sessionId)).payment_status).toBe('paid');
    expect((await orderOf(paid.orderId)).status).toBe('pending_payment');
    await app.restart();

    // The restart itself gives nothing back: the abandoned hold still runs.
    expect(Date.now()).toBeLessThan(Number((await checkoutOf(abandoned.checkoutId)).reserved_until));
    expect(await quantityOf(unpaidListing)).toBe(0);
    expect((await orderOf(abandoned.orderId)).status).toBe('pending_payment');

    await until('the paid order after the restart', async () => (await orderOf(paid.orderId)).status === 'paid', 20_000);
    const late = await releasedLate(abandoned.checkoutId);
    expect(late).toBeGreaterThanOrEqual(0);
    expect(late).toBeLessThan(RELEASE_SLACK_MS);
    expect(await quantityOf(unpaidListing)).toBe(1);
    expect((await orderOf(abandoned.orderId)).status).toBe('cancelled');
    expect((await provider.checkout.sessions.retrieve(abandoned.sessionId)).status).toBe('expired');
    expect(await pay(abandoned.sessionId)).toBeGreaterThanOrEqual(400);

    // The paid checkout's hold ran out before the abandoned one's, so the job has had its chance to ask the
    // provider; once the redelivered webhook has landed too, both ways of learning of the payment are spent.
    const [completed] = (await provider.events.list({ type: 'checkout.session.completed', limit: 100 })).data.filter(
      (e) => (e.data.object as Stripe.Checkout.Session).id === paid.sessionId,
    );
    expect(completed).toBeDefined();
    await until(
      'the redelivered webhook',
      async () => (await sql('SELECT 1 FROM provider_events WHERE id = ?', [completed!.id])).length === 1,
      20_000,
    );
    expect((await orderOf(paid.orderId)).status).toBe('paid');
    expect(await paidEntries(paid.orderId)).toBe(1);
    expect(await quantityOf(paidListing)).toBe(0);
    const intents = (await provider.paymentIntents.list({ limit: 100 })).data.filter((pi) => pi.metadata.checkoutId === paid.checkoutId);
    expect(intents).toHaveLength(1);
    const charges = await provider.charges.list({ payment_intent: intents[0]!.id });
    expect(charges.data.map((c) => [c.amount, c.status])).toEqual([[50_000, 'succeeded']]);
    expect(await integrity()).toEqual(['ok']);
  }, 60_000);

  test('SIGKILL while the provider call of a checkout hangs: the hold is released on time, the cart is kept, and the retry pays once', async () => {
    const listingId = await liveListing(1, 'Killed-mid-call mirror');
    const buyer = await newBuyer();
    expect((await buyer.client.post('/api/cart/items', { listingId, quantity: 1 })).status).toBe(201);

    await stripeFake.down();
    const hole = await blackHole(stripeFake.port);
    const answer = buyer.client.post('/api/checkout', {}).then(
      (r) => r.status,
      (e: Error) => e,
    );
    const call = await hole.arrived;
    expect(call.url).toBe('/v1/checkout/sessions');
    // The reservation is committed before the provider is asked.
    expect(await quantityOf(listingId)).toBe(0);
    const [held] = await sql("SELECT id, provider_session_id FROM checkouts WHERE buyer_id = ? AND status = 'open'", [buyer.id]);
    expect(held!.provider_session_id).toBeNull();

    await app.kill('SIGKILL');
    expect(await answer).toBeInstanceOf(Error);
    await hole.close();
    await stripeFake.up();
    await app.restart();

    const checkoutId = String(held!.id);
    const late = await releasedLate(checkoutId);
    expect(late).toBeGreaterThanOrEqual(0);
    expect(late).toBeLessThan(RELEASE_SLACK_MS);
    expect((await checkoutOf(checkoutId)).status).toBe('expired');
    expect(await quantityOf(listingId)).toBe(1);
    expect((await sql("SELECT count(*) AS n FROM orders WHERE buyer_id = ? AND status = 'pending_payment'", [buyer.id]))[0]!.n).toBe(0);
    const cart = await (await buyer.client.get('/api/cart')).json();
    expect(cart.items.map((i: { listingId: string }) => i.listingId)).toEqual([listingId]);

    const retry = await buyer.client.post('/api/checkout', {});
    expect(retry.status).toBe(201);
    const { orderIds, sessionId } = await retry.json();
    expect(await pay(sessionId)).toBe(200);
    await until('the retried order to be paid', async () => (await orderOf(orderIds[0])).status === 'paid');
    expect(await paidEntries(orderIds[0])).toBe(1);
    const sessions = (await provider.checkout.sessions.list({ limit: 100 })).data.filter((s) => s.customer_email === buyer.email);
    expect(sessions.map((s) => s.payment_status)).toEqual(['paid']);
    expect(await integrity()).toEqual(['ok']);
  }, 60_000);

  test('payment provider down: checkout answers 503 with a retry message and leaves stock, orders and cart as they were', async () => {
    const listingId = await liveListing(2, 'Provider-down mirror');
    const buyer = await newBuyer();
    expect((await buyer.client.post('/api/cart/items', { listingId, quantity: 1 })).status).toBe(201);

    await stripeFake.down();
    const res = await buyer.client.post('/api/checkout', {});
    expect(res.status).toBe(503);
    expect(res.headers.get('content-type')).toMatch(/application\/json/);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    const { error } = await res.json();
    expect(error.message).toMatch(/Nothing was charged; try again/);
    expect(await quantityOf(listingId)).toBe(2);
    expect(await sql("SELECT id FROM checkouts WHERE buyer_id = ? AND status = 'open'", [buyer.id])).toHaveLength(0);
    expect(await sql("SELECT id FROM orders WHERE buyer_id = ? AND status = 'pending_payment'", [buyer.id])).toHaveLength(0);
    const cart = await (await buyer.client.get('/api/cart')).json();
    expect(cart.items).toHaveLength(1);
    expect(await (await new Client(app.origin).get(`/api/listings/${listingId}`)).json()).toMatchObject({ listing: { status: 'live' } });

    await stripeFake.up();
    const again = await buyer.client.post('/api/checkout', {});
    expect(again.status).toBe(201);
    expect(await quantityOf(listingId)).toBe(1);
  });

  test('SMTP down: sign-up succeeds, the mail waits in the outbox with its error and goes out once when the relay is back', async () => {
    await mailFake.down();
    const email = `faults.smtp.${Date.now()}@lab.example`;
    const signUp = await new Client(app.origin).post('/api/auth/sign-up', { email, password: 'smtp-password-1', name: 'Relay Down' });
    expect(signUp.status).toBe(201);

    const waiting = await until(
      'a second failed delivery attempt',
      async () => {
        const [row] = await sql('SELECT status, attempts, last_error FROM mail_outbox WHERE "to" = ?', [email]);
        return row && Number(row.attempts) >= 2 && row;
      },
      15_000,
    );
    expect(waiting.status).toBe('pending');
    expect(String(waiting.last_error)).toMatch(/ECONNREFUSED/);
    expect(await mailTo(mailDir(), email)).toHaveLength(0);

    await mailFake.up();
    const mail = await waitForMail(mailDir(), email, /Confirm your e-mail address/, 15_000);
    expect(mail.text).toMatch(/\/verify\?token=/);
    const [sent] = await sql('SELECT status, sent_at FROM mail_outbox WHERE "to" = ?', [email]);
    expect(sent!.status).toBe('sent');
    expect(sent!.sent_at).not.toBeNull();
    // One more outbox round: a message that was delivered is not sent again.
    await new Promise((r) => setTimeout(r, 3_500));
    expect(await mailTo(mailDir(), email)).toHaveLength(1);
  }, 60_000);

  test('object storage down: completing an upload answers 503 and leaves the file pending; the same upload completes once storage is back', async () => {
    const seller = await as('seller2');
    const created = await seller.post('/api/listings', mirror(1, 'Storage-down mirror'));
    const { id: listingId } = await created.json();
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#3366aa' } })
      .png()
      .toBuffer();
    const spec = { kind: 'photo', filename: 'mirror.png', contentType: 'image/png', size: png.byteLength };
    const put = (url: string) => fetch(url, { method: 'PUT', headers: { 'content-type': 'image/png' }, body: new Uint8Array(png) });
    const fileRow = async (fileId: string) => (await sql('SELECT status, variants FROM listing_files WHERE id = ?', [fileId]))[0]!;
    const expectUnavailable = async (res: Response) => {
      expect(res.status).toBe(503);
      expect(res.headers.get('content-type')).toMatch(/application\/json/);
      expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
      expect((await res.json()).error).toMatchObject({ code: 'unavailable', message: expect.stringMatching(/storage/) });
    };

    // Down before the bytes arrive: signing the PUT needs no storage, the PUT itself fails.
    await s3Fake.down();
    const early = await seller.post(`/api/listings/${listingId}/uploads`, spec);
    expect(early.status).toBe(201);
    const first = (await early.json()) as { fileId: string; uploadUrl: string };
    await expect(put(first.uploadUrl)).rejects.toThrow();
    await expectUnavailable(await seller.post(`/api/listings/${listingId}/uploads/${first.fileId}/complete`));
    expect(await fileRow(first.fileId)).toMatchObject({ status: 'pending', variants: null });

    // Down after the bytes arrived, while the server reads and re-encodes them.
    await s3Fake.up();
    const late = (await (await seller.post(`/api/listings/${listingId}/uploads`, spec)).json()) as { fileId: string; uploadUrl: string };
    expect((await put(late.uploadUrl)).status).toBe(200);
    await s3Fake.down();
    await expectUnavailable(await seller.post(`/api/listings/${listingId}/uploads/${late.fileId}/complete`));
    expect(await fileRow(late.fileId)).toMatchObject({ status: 'pending', variants: null });

    await s3Fake.up();
    expect((await put(first.uploadUrl)).status).toBe(200);
    for (const fileId of [first.fileId, late.fileId]) {
      const done = await seller.post(`/api/listings/${listingId}/uploads/${fileId}/complete`);
      expect(done.status).toBe(200);
      expect(await done.json()).toMatchObject({ id: fileId, kind: 'photo', width: 64, height: 48 });
      expect((await fileRow(fileId)).status).toBe('ready');
      const thumb = await seller.get(`/api/files/${fileId}?variant=w320`);
      expect(thumb.status).toBe(302);
      expect((await fetch(thumb.headers.get('location')!)).status).toBe(200);
    }
  });

  test('database file held by a long writer: writes wait for the busy timeout and answer 503 with Retry-After; every write acknowledged is committed', async () => {
    const listingId = await liveListing(3, 'Locked-database mirror');
    const first = await newBuyer();
    const second = await newBuyer();
    const other = createClient({ url: app.env.DATABASE_URL! });
    const writer = await other.transaction('write');
    const cartOf = async (buyerId: string) => {
      const fresh = createClient({ url: app.env.DATABASE_URL! });
      try {
        return (await fresh.execute({ sql: 'SELECT quantity FROM cart_items WHERE user_id = ?', args: [buyerId] })).rows.map((r) =>
          Number(r.quantity),
        );
      } finally {
        fresh.close();
      }
    };
    let elapsed = 0;
    let answers: Response[];
    try {
      await writer.execute({
        sql: "INSERT INTO audit_log (action, subject_type, subject_id, created_at) VALUES ('test.long_writer', 'test', ?, ?)",
        args: [listingId, Date.now()],
      });
      const started = Date.now();
      const firstAnswer = first.client.post('/api/cart/items', { listingId, quantity: 1 });
      // A second write queues behind the first while the first waits.
      await new Promise((r) => setTimeout(r, 200));
      const secondAnswer = second.client.post('/api/cart/items', { listingId, quantity: 2 });
      // The lock is held until the app has answered the first write, however long that takes.
      const res = await firstAnswer;
      elapsed = Date.now() - started;
      await writer.commit();
      answers = [res, await secondAnswer];
    } finally {
      writer.close();
      other.close();
    }
    expect(elapsed).toBeGreaterThanOrEqual(4_500);
    expect(elapsed).toBeLessThan(15_000);
    expect(answers[0]!.status).toBe(503);
    expect(answers[0]!.headers.get('content-type')).toMatch(/application\/json/);
    expect(Number(answers[0]!.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await answers[0]!.json()).error.code).toBe('unavailable');
    expect(await cartOf(first.id)).toEqual([]);
    // The queued write may have got the lock once it was free; if it was acknowledged, it must be committed.
    expect([201, 503]).toContain(answers[1]!.status);
    expect(await cartOf(second.id)).toEqual(answers[1]!.status === 201 ? [2] : []);
    expect(await sql("SELECT id FROM audit_log WHERE action = 'test.long_writer' AND subject_id = ?", [listingId])).toHaveLength(1);

    // After the lock is gone every write works and is committed where another connection sees it.
    for (const quantity of [1, 2]) {
      expect((await first.client.post('/api/cart/items', { listingId, quantity })).status).toBe(201);
      expect(await cartOf(first.id)).toEqual([quantity]);
    }
    const checkout = await first.client.post('/api/checkout', {});
    expect(checkout.status).toBe(201);
    const { orderIds } = await checkout.json();
    const fresh = createClient({ url: app.env.DATABASE_URL! });
    try {
      expect(
        (await fresh.execute({ sql: 'SELECT status FROM orders WHERE id = ?', args: [orderIds[0]] })).rows.map((r) => r.status),
      ).toEqual(['pending_payment']);
      expect((await fresh.execute('PRAGMA integrity_check')).rows.map((r) => r[0])).toEqual(['ok']);
    } finally {
      fresh.close();
    }
  });
});
