import Stripe from 'stripe';
import { beforeEach, describe, expect, test } from 'vitest';
import { stripeFakeHarness, waitFor } from './stripe-harness';

const KEY = 'sk_test_lightyard_fake';
const WEBHOOK_SECRET = 'whsec_test_secret';

const { fake, start, sdk, startReceiver } = stripeFakeHarness(KEY);

function fakeUrl(path: string): string {
  return `http://127.0.0.1:${fake().port}${path}`;
}

function triggerEvent(body: unknown, headers: Record<string, string> = {}): Promise<Response> {
  return fetch(fakeUrl('/_fake/events'), {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', ...headers },
    body: JSON.stringify(body),
  });
}

describe('payments fake: API basics through the SDK', () => {
  beforeEach(() => start());

  test('retrieves the balance', async () => {
    const balance = await sdk().balance.retrieve();
    const zero = [{ amount: 0, currency: 'eur', source_types: { card: 0 } }];
    expect(balance).toEqual({ object: 'balance', available: zero, pending: zero, livemode: false });
  });

  test('an unknown object is a StripeInvalidRequestError with code resource_missing', async () => {
    const failure = sdk().customers.retrieve('cus_missing');
    await expect(failure).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    await expect(failure).rejects.toMatchObject({
      statusCode: 404,
      code: 'resource_missing',
      param: 'id',
      message: "No such customer: 'cus_missing'",
    });
  });

  test('a nested object type or an action on a missing object is named as the provider names it', async () => {
    await expect(sdk().checkout.sessions.retrieve('cs_test_missing')).rejects.toMatchObject({
      message: "No such checkout.session: 'cs_test_missing'",
      code: 'resource_missing',
    });
    await expect(sdk().paymentIntents.confirm('pi_missing')).rejects.toMatchObject({
      message: "No such payment_intent: 'pi_missing'",
      code: 'resource_missing',
    });
  });

  test('an unknown URL answers 404 in the provider error shape', async () => {
    const response = await fetch(fakeUrl('/v1/no_such_thing'), { headers: { Authorization: `Bearer ${KEY}` } });
    expect(response.status).toBe(404);
    expect(response.headers.get('request-id')).toMatch(/^req_/);
    const { error } = await response.json();
    expect(error).toMatchObject({ type: 'invalid_request_error', code: 'resource_missing' });
    expect(error.message).toContain('Unrecognized request URL (GET: /v1/no_such_thing)');
  });

  test('a request without an API key gets the 401 the provider gives', async () => {
    const response = await fetch(fakeUrl('/v1/balance'));
    expect(response.status).toBe(401);
    const { error } = await response.json();
    expect(error.type).toBe('invalid_request_error');
    expect(error.message).toMatch(/^You did not provide an API key\./);
  });

  test('a key that is not a test-mode key is refused as a StripeAuthenticationError', async () => {
    const failure = sdk('sk_live_0123456789abcdef').balance.retrieve();
    await expect(failure).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    await expect(failure).rejects.toMatchObject({
      statusCode: 401,
      message: expect.stringMatching(/^Invalid API Key provided: sk_live_\*+cdef$/),
    });
  });
});

describe('payments fake: events, webhooks and idempotency', () => {
  test('delivers a signed event, retries after a failure, and records the delivery', async () => {
    const receiver = await startReceiver(1);
    await start({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, webhookRetryDelaysMs: [50] });

    const response = await triggerEvent({ type: 'payout.paid', object: { id: 'po_1', object: 'payout' } });
    expect(response.status).toBe(200);
    const emitted = await response.json();
    expect(emitted).toMatchObject({ object: 'event', type: 'payout.paid', pending_webhooks: 1, livemode: false });

    await waitFor(() => receiver.deliveries.length === 2);
    for (const delivery of receiver.deliveries) {
      const event = sdk().webhooks.constructEvent(delivery.body, delivery.signature, WEBHOOK_SECRET);
      expect(event.id).toBe(emitted.id);
      expect(event.data.object).toEqual({ id: 'po_1', object: 'payout' });
    }
    expect(() => sdk().webhooks.constructEvent(receiver.deliveries[0]!.body, receiver.deliveries[0]!.signature, 'whsec_other')).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );

    // The fake marks the event delivered once it has read the 2xx answer.
    await waitFor(async () => (await sdk().events.retrieve(emitted.id)).pending_webhooks === 0);
  });

  test('gives up after the last retry delay', async () => {
    const receiver = await startReceiver(Number.POSITIVE_INFINITY);
    await start({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, webhookRetryDelaysMs: [20, 20] });
    const emitted = await (await triggerEvent({ type: 'account.updated', object: { id: 'acct_1' } })).json();

    await waitFor(() => receiver.deliveries.length === 3);
    await new Promise((resolve) => setTimeout(resolve, 150));
    expect(receiver.deliveries).toHaveLength(3);
    expect((await sdk().events.retrieve(emitted.id)).pending_webhooks).toBe(1);
  });

  test('lists events newest first with cursors and keeps them across a restart', async () => {
    await start();
    const ids: string[] = [];
    for (const type of ['payout.created', 'payout.paid', 'payout.created']) {
      ids.push((await (await triggerEvent({ type, object: { id: 'po_1' } })).json()).id);
    }

    const page = await sdk().events.list({ limit: 2 });
    expect(page.data.map((event) => event.id)).toEqual([ids[2], ids[1]]);
    expect(page.has_more).toBe(true);
    const next = await sdk().events.list({ limit: 2, starting_after: ids[1] });
    expect(next.data.map((event) => event.id)).toEqual([ids[0]]);
    expect(next.has_more).toBe(false);
    const created = await sdk().events.list({ type: 'payout.created' });
    expect(created.data.map((event) => event.id)).toEqual([ids[2], ids[0]]);

    await fake().stop();
    await start();
    expect((await sdk().events.retrieve(ids[0]!)).type).toBe('payout.created');
  });

  test('the same Idempotency-Key and body replay the first response', async () => {
    await start();
    const body = { type: 'transfer.created', object: { id: 'tr_1' } };
    const first = await triggerEvent(body, { 'Idempotency-Key': 'key-1' });
    const second = await triggerEvent(body, { 'Idempotency-Key': 'key-1' });

    expect(second.headers.get('idempotent-replayed')).toBe('true');
    expect(second.headers.get('request-id')).toBe(first.headers.get('request-id'));
    const firstEvent = await first.json();
    expect(await second.json()).toEqual(firstEvent);
    expect((await sdk().events.list()).data.map((event) => event.id)).toEqual([firstEvent.id]);
  });

  test('the same Idempotency-Key with another body is an idempotency_error', async () => {
    await start();
    await triggerEvent({ type: 'transfer.created', object: { id: 'tr_1' } }, { 'Idempotency-Key': 'key-2' });
    const reused = await triggerEvent({ type: 'transfer.created', object: { id: 'tr_2' } }, { 'Idempotency-Key': 'key-2' });

    expect(reused.status).toBe(400);
    expect((await reused.json()).error).toEqual({
      type: 'idempotency_error',
      message:
        "Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than 'key-2' if you meant to execute a different request.",
    });
  });

  test('an idempotency_error reaches SDK code as a StripeIdempotencyError', async () => {
    await start();
    await triggerEvent({ type: 'a', object: {} }, { 'Idempotency-Key': 'key-3' });
    await triggerEvent({ type: 'b', object: {} }, { 'Idempotency-Key': 'key-3' });
    const failure = sdk().rawRequest('POST', '/_fake/events', {}, { idempotencyKey: 'key-3' });
    await expect(failure).rejects.toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });
});
