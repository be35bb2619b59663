import Stripe from 'stripe';
import { describe, expect, test } from 'vitest';
import { stripeFakeHarness, waitFor, type Delivery } from './stripe-harness';

const KEY = 'sk_test_lightyard_checkout';
const WEBHOOK_SECRET = 'whsec_checkout_test';
const SHOP = 'http://127.0.0.1:4321';

const { fake, start, sdk, startReceiver } = stripeFakeHarness(KEY);

function nowSeconds(): number {
  return Math.floor(Date.now() / 1000);
}

function createSession(overrides: Partial<Stripe.Checkout.SessionCreateParams> = {}, options?: Stripe.RequestOptions) {
  return sdk().checkout.sessions.create(
    {
      mode: 'payment',
      line_items: [
        { price_data: { currency: 'eur', unit_amount: 125_000, product_data: { name: 'Mirror pair R=500 mm' } }, quantity: 2 },
        { price_data: { currency: 'eur', unit_amount: 4_950, product_data: { name: 'Kinematic mount' } }, quantity: 1 },
      ],
      success_url: `${SHOP}/orders/paid?session={CHECKOUT_SESSION_ID}`,
      cancel_url: `${SHOP}/cart`,
      client_reference_id: 'buyer_42',
      metadata: { order_ids: 'ord_1,ord_2' },
      expires_at: nowSeconds() + 30 * 60,
      payment_intent_data: { metadata: { order_ids: 'ord_1,ord_2' }, transfer_group: 'checkout_1' },
      ...overrides,
    },
    options,
  );
}

/** Submits the hosted page's form the way a browser would, without following the redirect. */
function submitForm(url: string, fields: Record<string, string>): Promise<Response> {
  return fetch(url, {
    method: 'POST',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams(fields).toString(),
    redirect: 'manual',
  });
}

function card(number: string): Record<string, string> {
  return { email: 'buyer@example.test', name: 'Ada Buyer', card_number: number, expiry: '12 / 34', cvc: '123' };
}

function payByTestRoute(sessionId: string, body: Record<string, unknown>): Promise<Response> {
  return fetch(`${fake().url}/_fake/checkout/sessions/${sessionId}/pay`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify(body),
  });
}

async function paymentIntentOf(sessionId: string): Promise<Stripe.PaymentIntent> {
  const session = await sdk().checkout.sessions.retrieve(sessionId, { expand: ['payment_intent'] });
  return session.payment_intent as Stripe.PaymentIntent;
}

function typesOf(deliveries: Delivery[]): string[] {
  return deliveries.map((delivery) => (JSON.parse(delivery.body) as { type: string }).type);
}

describe('payments fake: checkout sessions and the hosted pay page', () => {
  test('creates a session in the provider shape, with its line items and a plain pay page', async () => {
    await start();
    const session = await createSession();
    expect(session).toMatchObject({
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: 254_950,
      currency: 'eur',
      livemode: false,
      client_reference_id: 'buyer_42',
      metadata: { order_ids: 'ord_1,ord_2' },
      payment_intent: null,
      url: `${fake().url}/pay/${session.id}`,
    });
    expect(session.id).toMatch(/^cs_test_[A-Za-z0-9]{58}$/);
    expect(Math.abs(session.created - nowSeconds())).toBeLessThanOrEqual(2);

    const items = await sdk().checkout.sessions.listLineItems(session.id);
    expect(items).toMatchObject({ object: 'list', has_more: false, url: `/v1/checkout/sessions/${session.id}/line_items` });
    expect(items.data.map((item) => [item.description, item.quantity, item.amount_total, item.price?.unit_amount])).toEqual([
      ['Mirror pair R=500 mm', 2, 250_000, 125_000],
      ['Kinematic mount', 1, 4_950, 4_950],
    ]);
    const expanded = await sdk().checkout.sessions.retrieve(session.id, { expand: ['line_items'] });
    expect(expanded.line_items?.data).toHaveLength(2);

    const page = await fetch(session.url ?? '');
    expect(page.status).toBe(200);
    expect(page.headers.get('content-type')).toBe('text/html; charset=utf-8');
    expect(page.headers.get('content-security-policy')).toContain("default-src 'none'");
    const markup = await page.text();
    expect(markup).toContain(`<form method="post" action="/pay/${session.id}">`);
    expect(markup).toContain('name="card_number"');
    expect(markup).toContain('Mirror pair R=500 mm × 2');
    expect(markup).toContain('Pay €2,549.50');
    expect(markup).toContain(`href="${SHOP}/cart"`);
    expect(markup).not.toMatch(/<script|<link rel="stylesheet"|src="http/);
  });

  test('paying with 4242 through the page form completes the session and delivers a signed checkout.session.completed', async () => {
    const receiver = await startReceiver();
    await start({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET });
    const session = await createSession();

    const paid = await submitForm(session.url ?? '', card('4242 4242 4242 4242'));
    expect(paid.status).toBe(303);
    expect(paid.headers.get('location')).toBe(`${SHOP}/orders/paid?session=${session.id}`);

    const completed = await sdk().checkout.sessions.retrieve(session.id, { expand: ['payment_intent.latest_charge'] });
    expect(completed).toMatchObject({ status: 'complete', payment_status: 'paid', url: null });
    expect(completed.customer_details).toMatchObject({ email: 'buyer@example.test', name: 'Ada Buyer' });
    const paymentIntent = completed.payment_intent as Stripe.PaymentIntent;
    expect(paymentIntent).toMatchObject({
      object: 'payment_intent',
      status: 'succeeded',
      amount: 254_950,
      amount_received: 254_950,
      metadata: { order_ids: 'ord_1,ord_2' },
      transfer_group: 'checkout_1',
    });
    expect(paymentIntent.id).toMatch(/^pi_/);
    const charge = paymentIntent.latest_charge as Stripe.Charge;
    expect(charge).toMatchObject({
      object: 'charge',
      status: 'succeeded',
      paid: true,
      amount: 254_950,
      amount_refunded: 0,
      refunded: false,
    });
    expect(charge.id).toMatch(/^ch_/);
    expect(charge.payment_method_details?.card).toMatchObject({ brand: 'visa', last4: '4242', exp_month: 12, exp_year: 2034 });

    await waitFor(() => typesOf(receiver.deliveries).includes('checkout.session.completed'));
    const delivery = receiver.deliveries.find((entry) => entry.body.includes('"checkout.session.completed"'));
    const event = sdk().webhooks.constructEvent(delivery?.body ?? '', delivery?.signature ?? '', WEBHOOK_SECRET);
    expect(event.id).toMatch(/^evt_/);
    expect(event.data.object).toMatchObject({ id: session.id, status: 'complete', payment_intent: paymentIntent.id });
    await waitFor(() => receiver.deliveries.length >= 4);
    expect(typesOf(receiver.deliveries)).toEqual(
      expect.arrayContaining(['payment_intent.created', 'charge.succeeded', 'payment_intent.succeeded', 'checkout.session.completed']),
    );
    expect(new Set(receiver.deliveries.map((entry) => JSON.parse(entry.body).id)).size).toBe(receiver.deliveries.length);

    const again = await fetch(session.url ?? '');
    expect(again.status).toBe(200);
    expect(await again.text()).toContain('This checkout is paid');
    expect((await submitForm(session.url ?? '', card('4242424242424242'))).status).toBe(409);
    const balance = await sdk().balance.retrieve();
    expect(balance.available).toEqual([{ amount: 254_950, currency: 'eur', source_types: { card: 254_950 } }]);
  });

  test('a declined card keeps the session open with payment_intent.payment_failed; a good card then pays', async () => {
    await start();
    const session = await createSession();

    const declined = await submitForm(session.url ?? '', card('4000000000000002'));
    expect(declined.status).toBe(402);
    const markup = await declined.text();
    expect(markup).toContain('role="alert">Your card was declined.</div>');
    expect(markup).toContain('value="Ada Buyer"');

    expect((await sdk().checkout.sessions.retrieve(session.id)).status).toBe('open');
    const failed = await paymentIntentOf(session.id);
    expect(failed.status).toBe('requires_payment_method');
    expect(failed.last_payment_error).toMatchObject({ type: 'card_error', code: 'card_declined', decline_code: 'generic_decline' });
    const charge = await sdk().charges.retrieve(failed.latest_charge as string);
    expect(charge).toMatchObject({ status: 'failed', paid: false, failure_code: 'card_declined' });
    const events = await sdk().events.list({ type: 'payment_intent.payment_failed' });
    expect(events.data.map((event) => (event.data.object as { id: string }).id)).toEqual([failed.id]);

    const paid = await payByTestRoute(session.id, { card: '4242424242424242' });
    expect(paid.status).toBe(200);
    expect(await paid.json()).toMatchObject({ id: session.id, status: 'complete', payment_intent: failed.id });
    expect((await sdk().paymentIntents.retrieve(failed.id)).status).toBe('succeeded');
  });

  test('the card that needs confirmation pays once "Complete authentication" is pressed', async () => {
    await start();
    const session = await createSession();

    const submitted = await submitForm(session.url ?? '', card('4000002500003155'));
    expect(submitted.status).toBe(303);
    const authenticationUrl = `${fake().url}${submitted.headers.get('location')}`;
    expect(authenticationUrl).toBe(`${fake().url}/pay/${session.id}/authenticate`);
    const waiting = await paymentIntentOf(session.id);
    expect(waiting).toMatchObject({ status: 'requires_action', next_action: { type: 'redirect_to_url' } });

    const step = await fetch(authenticationUrl);
    expect(step.status).toBe(200);
    const markup = await step.text();
    expect(markup).toContain('Complete authentication');
    expect(markup).toContain('Fail authentication');

    const done = await submitForm(authenticationUrl, { result: 'complete' });
    expect(done.status).toBe(303);
    expect(done.headers.get('location')).toBe(`${SHOP}/orders/paid?session=${session.id}`);
    const paid = await sdk().checkout.sessions.retrieve(session.id, { expand: ['payment_intent.latest_charge'] });
    expect(paid.status).toBe('complete');
    const charge = (paid.payment_intent as Stripe.PaymentIntent).latest_charge as Stripe.Charge;
    expect(charge.payment_method_details?.card?.three_d_secure).toMatchObject({ result: 'authenticated' });
  });

  test('"Fail authentication" leaves the session open and records payment_intent.payment_failed', async () => {
    await start();
    const session = await createSession();
    await submitForm(session.url ?? '', card('4000002500003155'));

    const failed = await submitForm(`${fake().url}/pay/${session.id}/authenticate`, { result: 'fail' });
    expect(failed.status).toBe(402);
    expect(await failed.text()).toContain('has failed authentication');
    expect((await sdk().checkout.sessions.retrieve(session.id)).status).toBe('open');
    const paymentIntent = await paymentIntentOf(session.id);
    expect(paymentIntent).toMatchObject({ status: 'requires_payment_method', latest_charge: null });
    expect(paymentIntent.last_payment_error?.code).toBe('payment_intent_authentication_failure');
    expect((await sdk().events.list({ type: 'payment_intent.payment_failed' })).data).toHaveLength(1);
    // Nothing is waiting any more: the confirmation page sends the buyer back to the form.
    const back = await fetch(`${fake().url}/pay/${session.id}/authenticate`, { redirect: 'manual' });
    expect(back.status).toBe(303);
  });

  test('the test-only pay route gives the outcomes the page gives', async () => {
    await start();
    const authenticated = await createSession();
    const body = await (await payByTestRoute(authenticated.id, { card: '4000002500003155', authenticate: true })).json();
    expect(body).toMatchObject({ object: 'checkout.session', status: 'complete', payment_status: 'paid' });

    const refused = await createSession();
    expect(await (await payByTestRoute(refused.id, { card: '4000002500003155', authenticate: false })).json()).toMatchObject({
      status: 'open',
    });
    expect((await paymentIntentOf(refused.id)).last_payment_error?.code).toBe('payment_intent_authentication_failure');

    const waiting = await createSession();
    await payByTestRoute(waiting.id, { card: '4000002500003155' });
    expect((await paymentIntentOf(waiting.id)).status).toBe('requires_action');
    expect(await (await payByTestRoute(waiting.id, { authenticate: true })).json()).toMatchObject({ status: 'complete' });

    const mistyped = await createSession();
    expect(await (await payByTestRoute(mistyped.id, { card: '4242424242424241' })).json()).toMatchObject({
      status: 'open',
      payment_intent: null,
    });

    const missing = await payByTestRoute('cs_test_missing', { card: '4242424242424242' });
    expect(missing.status).toBe(404);
    expect((await missing.json()).error.message).toBe("No such checkout.session: 'cs_test_missing'");
  });
});

describe('payments fake: session expiry', () => {
  test('expire through the SDK: payment is refused afterwards and checkout.session.expired is recorded', async () => {
    await start();
    const session = await createSession();
    await payByTestRoute(session.id, { card: '4000000000000002' });

    const expired = await sdk().checkout.sessions.expire(session.id);
    expect(expired).toMatchObject({ id: session.id, status: 'expired', url: null, payment_status: 'unpaid' });
    const paymentIntent = await paymentIntentOf(session.id);
    expect(paymentIntent).toMatchObject({ status: 'canceled', cancellation_reason: 'abandoned' });

    await expect(sdk().checkout.sessions.expire(session.id)).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      message: 'Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of `expired`.',
    });
    const page = await fetch(session.url ?? '');
    expect(page.status).toBe(410);
    expect(await page.text()).toContain('This checkout has expired');
    expect((await submitForm(session.url ?? '', card('4242424242424242'))).status).toBe(410);
    const viaRoute = await payByTestRoute(session.id, { card: '4242424242424242' });
    expect(viaRoute.status).toBe(410);

    const [event] = (await sdk().events.list({ type: 'checkout.session.expired' })).data;
    expect(event?.data.object).toMatchObject({ id: session.id, status: 'expired' });
    expect(event?.request?.id).toMatch(/^req_/);
  });

  test('a session expires by itself at expires_at', async () => {
    const receiver = await startReceiver();
    await start({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET });
    const session = await createSession({ expires_at: nowSeconds() + 1 });

    await waitFor(async () => (await sdk().checkout.sessions.retrieve(session.id)).status === 'expired', 4_000);
    await waitFor(() => typesOf(receiver.deliveries).includes('checkout.session.expired'));
    const delivery = receiver.deliveries.find((entry) => entry.body.includes('"checkout.session.expired"'));
    const event = sdk().webhooks.constructEvent(delivery?.body ?? '', delivery?.signature ?? '', WEBHOOK_SECRET);
    expect(event.data.object).toMatchObject({ id: session.id, status: 'expired' });
    expect(event.request).toEqual({ id: null, idempotency_key: null });
  });

  test('a session whose expires_at passed while the fake was stopped is expired on restart', async () => {
    await start();
    const session = await createSession({ expires_at: nowSeconds() + 1 });
    const kept = await createSession();
    await fake().stop();
    await new Promise((resolve) => setTimeout(resolve, 1_600));

    await start();
    expect((await sdk().checkout.sessions.retrieve(session.id)).status).toBe('expired');
    expect((await sdk().checkout.sessions.retrieve(kept.id)).status).toBe('open');
    expect((await sdk().events.list({ type: 'checkout.session.expired' })).data).toHaveLength(1);
    // The restarted fake still pays the other session, events and all.
    expect(await (await payByTestRoute(kept.id, { card: '4242424242424242' })).json()).toMatchObject({ status: 'complete' });
  });

  test('refuses an expires_at in the past or more than 24 hours ahead', async () => {
    await start();
    await expect(createSession({ expires_at: nowSeconds() - 10 })).rejects.toMatchObject({ param: 'expires_at', statusCode: 400 });
    await expect(createSession({ expires_at: nowSeconds() + 25 * 60 * 60 })).rejects.toMatchObject({
      param: 'expires_at',
      message: 'The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.',
    });
  });
});

describe('payments fake: listing, validation and idempotency of sessions', () => {
  test('lists sessions newest first with cursors and the status, payment_intent and created filters', async () => {
    await start();
    const first = await createSession();
    const second = await createSession();
    const third = await createSession();
    await payByTestRoute(second.id, { card: '4242424242424242' });
    const paymentIntent = (await sdk().checkout.sessions.retrieve(second.id)).payment_intent as string;

    const page = await sdk().checkout.sessions.list({ limit: 2 });
    expect(page.data.map((session) => session.id)).toEqual([third.id, second.id]);
    expect(page).toMatchObject({ object: 'list', has_more: true, url: '/v1/checkout/sessions' });
    const next = await sdk().checkout.sessions.list({ limit: 2, starting_after: second.id });
    expect(next.data.map((session) => session.id)).toEqual([first.id]);

    expect((await sdk().checkout.sessions.list({ status: 'complete' })).data.map((session) => session.id)).toEqual([second.id]);
    expect((await sdk().checkout.sessions.list({ payment_intent: paymentIntent })).data.map((session) => session.id)).toEqual([second.id]);
    expect((await sdk().checkout.sessions.list({ created: { gte: first.created } })).data).toHaveLength(3);
    expect((await sdk().checkout.sessions.list({ created: { lt: first.created } })).data).toHaveLength(0);

    const withIntents = await sdk().checkout.sessions.list({ status: 'complete', expand: ['data.payment_intent'] });
    expect((withIntents.data[0]?.payment_intent as Stripe.PaymentIntent).status).toBe('succeeded');
    const intents = await sdk().paymentIntents.list();
    expect(intents.data.map((intent) => intent.id)).toEqual([paymentIntent]);
  });

  test('refuses what the provider refuses, naming the parameter', async () => {
    await start();
    const missingQuantity = createSession({
      line_items: [{ price_data: { currency: 'eur', unit_amount: 100, product_data: { name: 'Lens' } } }],
    });
    await expect(missingQuantity).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    await expect(missingQuantity).rejects.toMatchObject({
      code: 'parameter_missing',
      param: 'line_items[0][quantity]',
      message: 'Missing required param: line_items[0][quantity].',
    });
    await expect(createSession({ line_items: [{ price: 'price_missing', quantity: 1 }] })).rejects.toMatchObject({
      code: 'resource_missing',
      message: "No such price: 'price_missing'",
    });
    await expect(createSession({ payment_intent_data: { capture_method: 'manual' } })).rejects.toMatchObject({
      code: 'parameter_unknown',
      param: 'payment_intent_data[capture_method]',
    });
    await expect(sdk().checkout.sessions.retrieve('cs_test_nope', { expand: ['customer_email'] })).rejects.toMatchObject({
      statusCode: 404,
    });
    const session = await createSession();
    await expect(sdk().checkout.sessions.retrieve(session.id, { expand: ['currency'] })).rejects.toMatchObject({
      message: 'This property cannot be expanded (currency).',
    });
  });

  test('an Idempotency-Key replays the session; the key with another body is the provider idempotency_error', async () => {
    await start();
    // One expires_at for both calls, so that the bodies are the same byte for byte.
    const sameBody = { expires_at: nowSeconds() + 45 * 60 };
    const first = await createSession(sameBody, { idempotencyKey: 'checkout-ord_1' });
    const replay = await createSession(sameBody, { idempotencyKey: 'checkout-ord_1' });
    expect(replay.id).toBe(first.id);
    expect(replay.lastResponse.headers['idempotent-replayed']).toBe('true');
    expect((await sdk().checkout.sessions.list()).data).toHaveLength(1);

    const other = createSession({ ...sameBody, client_reference_id: 'someone_else' }, { idempotencyKey: 'checkout-ord_1' });
    await expect(other).rejects.toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });
});
