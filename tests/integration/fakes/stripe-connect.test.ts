import Stripe from 'stripe';
import { describe, expect, test } from 'vitest';
import { FAILING_PAYOUT_AMOUNT } from '../../../fakes/stripe/server';
import { stripeFakeHarness, waitFor } from './stripe-harness';

const KEY = 'sk_test_lightyard_connect';
const WEBHOOK_SECRET = 'whsec_connect_test';
const APP = 'http://127.0.0.1:4321';

const harness = stripeFakeHarness(KEY);
const { fake, start, sdk } = harness;

/** The app's webhook endpoint stand-in; every delivery must pass the SDK's signature check, or events() throws. */
async function startReceiver(): Promise<{ url: string; events: () => Stripe.Event[] }> {
  const { url, deliveries } = await harness.startReceiver();
  return { url, events: () => deliveries.map(({ body, signature }) => sdk().webhooks.constructEvent(body, signature, WEBHOOK_SECRET)) };
}

/** A checkout for `amount` paid with the succeeding card; its PaymentIntent. */
async function paidPaymentIntent(amount: number): Promise<Stripe.PaymentIntent> {
  const session = await sdk().checkout.sessions.create({
    mode: 'payment',
    line_items: [{ price_data: { currency: 'eur', unit_amount: amount, product_data: { name: 'Beam splitter' } }, quantity: 1 }],
    success_url: `${APP}/paid`,
    payment_intent_data: { transfer_group: 'order_7' },
  });
  const response = await fetch(`${fake().url}/_fake/checkout/sessions/${session.id}/pay`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ card: '4242424242424242' }),
  });
  expect(response.status).toBe(200);
  return sdk().paymentIntents.retrieve((await response.json()).payment_intent);
}

function createAccount(): Promise<Stripe.Account> {
  return sdk().accounts.create({
    type: 'express',
    country: 'DE',
    email: 'lab@example.test',
    capabilities: { card_payments: { requested: true }, transfers: { requested: true } },
  });
}

function accountLink(account: string): Promise<Stripe.AccountLink> {
  return sdk().accountLinks.create({
    account,
    refresh_url: `${APP}/payouts/onboarding/refresh`,
    return_url: `${APP}/payouts/onboarding/done`,
    type: 'account_onboarding',
  });
}

function pressButton(url: string): Promise<Response> {
  return fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded' }, body: '', redirect: 'manual' });
}

async function onboardedAccount(): Promise<Stripe.Account> {
  const account = await createAccount();
  expect((await pressButton((await accountLink(account.id)).url)).status).toBe(303);
  return sdk().accounts.retrieve(account.id);
}

function eur(amount: number) {
  return [{ amount, currency: 'eur', source_types: { card: amount } }];
}

describe('payments fake: refunds', () => {
  test('refunds in part and then in full, updating the charge, with refund.created and charge.refunded', async () => {
    await start();
    const paymentIntent = await paidPaymentIntent(10_000);
    const chargeId = paymentIntent.latest_charge as string;

    const partial = await sdk().refunds.create({
      payment_intent: paymentIntent.id,
      amount: 2_500,
      reason: 'requested_by_customer',
      metadata: { order_id: 'ord_7' },
    });
    expect(partial).toMatchObject({
      object: 'refund',
      amount: 2_500,
      charge: chargeId,
      payment_intent: paymentIntent.id,
      currency: 'eur',
      reason: 'requested_by_customer',
      status: 'succeeded',
      metadata: { order_id: 'ord_7' },
    });
    expect(partial.id).toMatch(/^re_/);
    expect(await sdk().charges.retrieve(chargeId)).toMatchObject({ amount_refunded: 2_500, refunded: false });

    const rest = await sdk().refunds.create({ charge: chargeId });
    expect(rest.amount).toBe(7_500);
    expect(await sdk().charges.retrieve(chargeId)).toMatchObject({ amount_refunded: 10_000, refunded: true });

    const refunded = await sdk().events.list({ type: 'charge.refunded' });
    expect(refunded.data.map((event) => event.data.previous_attributes)).toEqual([
      { amount_refunded: 2_500, refunded: false },
      { amount_refunded: 0 },
    ]);
    expect((await sdk().events.list({ type: 'refund.created' })).data).toHaveLength(2);
    expect((await sdk().refunds.list({ payment_intent: paymentIntent.id })).data.map((refund) => refund.id)).toEqual([rest.id, partial.id]);
    expect((await sdk().refunds.retrieve(partial.id)).amount).toBe(2_500);
    expect((await sdk().balance.retrieve()).available).toEqual(eur(0));
  });

  test('refuses more than what is left with the provider error, and a charge refunded in full', async () => {
    await start();
    const paymentIntent = await paidPaymentIntent(10_000);

    const tooMuch = sdk().refunds.create({ payment_intent: paymentIntent.id, amount: 12_000 });
    await expect(tooMuch).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    await expect(tooMuch).rejects.toMatchObject({
      statusCode: 400,
      code: 'amount_too_large',
      param: 'amount',
      message: 'Refund amount (€120.00) is greater than charge amount (€100.00)',
    });
    await sdk().refunds.create({ payment_intent: paymentIntent.id, amount: 4_000 });
    await expect(sdk().refunds.create({ payment_intent: paymentIntent.id, amount: 7_000 })).rejects.toMatchObject({
      code: 'amount_too_large',
      message: 'Refund amount (€70.00) is greater than unrefunded amount on charge (€60.00)',
    });
    await sdk().refunds.create({ payment_intent: paymentIntent.id });
    await expect(sdk().refunds.create({ payment_intent: paymentIntent.id })).rejects.toMatchObject({
      code: 'charge_already_refunded',
      message: `Charge ${paymentIntent.latest_charge} has already been refunded.`,
    });
    await expect(sdk().refunds.create({ payment_intent: 'pi_missing' })).rejects.toMatchObject({
      statusCode: 400,
      code: 'resource_missing',
      message: "No such payment_intent: 'pi_missing'",
    });
  });

  test('an Idempotency-Key makes a retried refund one refund', async () => {
    await start();
    const paymentIntent = await paidPaymentIntent(10_000);
    const first = await sdk().refunds.create({ payment_intent: paymentIntent.id, amount: 1_000 }, { idempotencyKey: 'refund-ord_7-1' });
    const retried = await sdk().refunds.create({ payment_intent: paymentIntent.id, amount: 1_000 }, { idempotencyKey: 'refund-ord_7-1' });
    expect(retried.id).toBe(first.id);
    expect(retried.lastResponse.headers['idempotent-replayed']).toBe('true');
    expect((await sdk().charges.retrieve(paymentIntent.latest_charge as string)).amount_refunded).toBe(1_000);
    await expect(
      sdk().refunds.create({ payment_intent: paymentIntent.id, amount: 2_000 }, { idempotencyKey: 'refund-ord_7-1' }),
    ).rejects.toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });
});

describe('payments fake: connected accounts', () => {
  test('an express account is onboarded on the account link page, with a signed account.updated', async () => {
    const receiver = await startReceiver();
    await start({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET });
    const account = await createAccount();
    expect(account).toMatchObject({
      object: 'account',
      type: 'express',
      country: 'DE',
      default_currency: 'eur',
      email: 'lab@example.test',
      charges_enabled: false,
      payouts_enabled: false,
      details_submitted: false,
      capabilities: { card_payments: 'inactive', transfers: 'inactive' },
    });
    expect(account.id).toMatch(/^acct_[A-Za-z0-9]{16}$/);
    expect(account.requirements?.currently_due).toContain('external_account');

    const link = await accountLink(account.id);
    expect(link).toMatchObject({ object: 'account_link', expires_at: link.created + 300 });
    expect(link.url).toMatch(new RegExp(`^${fake().url}/onboard/[A-Za-z0-9]{32}$`));
    const page = await fetch(link.url);
    expect(page.status).toBe(200);
    const markup = await page.text();
    expect(markup).toContain('Complete onboarding');
    expect(markup).toContain(account.id);

    const done = await pressButton(link.url);
    expect(done.status).toBe(303);
    expect(done.headers.get('location')).toBe(`${APP}/payouts/onboarding/done`);
    const onboarded = await sdk().accounts.retrieve(account.id);
    expect(onboarded).toMatchObject({
      charges_enabled: true,
      payouts_enabled: true,
      details_submitted: true,
      capabilities: { card_payments: 'active', transfers: 'active' },
      requirements: { currently_due: [], disabled_reason: null },
    });
    expect(onboarded.external_accounts?.data[0]).toMatchObject({ object: 'bank_account', last4: '6789', currency: 'eur' });

    await waitFor(() => receiver.events().some((event) => event.type === 'account.updated'));
    const updated = receiver.events().find((event) => event.type === 'account.updated');
    expect(updated).toMatchObject({ account: account.id, data: { object: { id: account.id, charges_enabled: true } } });
    expect(updated?.data.previous_attributes).toMatchObject({ charges_enabled: false, payouts_enabled: false, details_submitted: false });

    // A used link sends the user to refresh_url, where the app makes a new one.
    const reused = await fetch(link.url, { redirect: 'manual' });
    expect(reused.headers.get('location')).toBe(`${APP}/payouts/onboarding/refresh`);
    expect((await sdk().accounts.list()).data.map((entry) => entry.id)).toEqual([account.id]);
  });

  test('refuses links for unknown accounts and requests for an account the key cannot reach', async () => {
    await start();
    await expect(accountLink('acct_missing')).rejects.toMatchObject({ code: 'resource_missing', param: 'account' });
    const failure = sdk().balance.retrieve({}, { stripeAccount: 'acct_missing' });
    await expect(failure).rejects.toBeInstanceOf(Stripe.errors.StripePermissionError);
    await expect(failure).rejects.toMatchObject({
      statusCode: 403,
      message: expect.stringContaining("does not have access to account 'acct_missing'"),
    });
  });
});

describe('payments fake: transfers and balances', () => {
  test('a transfer moves available platform balance to the connected account, with transfer.created', async () => {
    await start();
    const account = await onboardedAccount();
    await expect(sdk().transfers.create({ amount: 1_000, currency: 'eur', destination: account.id })).rejects.toMatchObject({
      code: 'balance_insufficient',
      message: expect.stringMatching(/^You have insufficient available funds in your Stripe account\./),
    });

    const paymentIntent = await paidPaymentIntent(20_000);
    expect((await sdk().balance.retrieve()).available).toEqual(eur(20_000));
    const transfer = await sdk().transfers.create({
      amount: 18_400,
      currency: 'eur',
      destination: account.id,
      transfer_group: 'order_7',
      metadata: { order_id: 'ord_7' },
    });
    expect(transfer).toMatchObject({
      object: 'transfer',
      amount: 18_400,
      amount_reversed: 0,
      currency: 'eur',
      destination: account.id,
      transfer_group: 'order_7',
      metadata: { order_id: 'ord_7' },
      reversed: false,
      source_transaction: null,
      livemode: false,
    });
    expect(transfer.id).toMatch(/^tr_/);

    expect((await sdk().balance.retrieve()).available).toEqual(eur(1_600));
    const connected = await sdk().balance.retrieve({}, { stripeAccount: account.id });
    expect(connected).toMatchObject({ object: 'balance', available: eur(18_400), pending: eur(0) });
    expect((await sdk().transfers.list({ destination: account.id })).data.map((entry) => entry.id)).toEqual([transfer.id]);
    expect((await sdk().transfers.retrieve(transfer.id, { expand: ['destination'] })).destination).toMatchObject({ id: account.id });
    const [created] = (await sdk().events.list({ type: 'transfer.created' })).data;
    expect(created?.data.object).toMatchObject({ id: transfer.id });
    expect(created?.account).toBeUndefined();

    await expect(sdk().transfers.create({ amount: 1_601, currency: 'eur', destination: account.id })).rejects.toMatchObject({
      code: 'balance_insufficient',
    });
    const fresh = await createAccount();
    await expect(sdk().transfers.create({ amount: 100, currency: 'eur', destination: fresh.id })).rejects.toMatchObject({
      code: 'insufficient_capabilities_for_transfer',
    });
    expect(paymentIntent.status).toBe('succeeded');
  });

  test('money stays pending for balanceAvailableAfterMs; source_transaction transfers it before then', async () => {
    await start({ balanceAvailableAfterMs: 60_000 });
    const account = await onboardedAccount();
    const paymentIntent = await paidPaymentIntent(5_000);
    expect(await sdk().balance.retrieve()).toMatchObject({ available: eur(0), pending: eur(5_000) });
    await expect(sdk().transfers.create({ amount: 4_600, currency: 'eur', destination: account.id })).rejects.toMatchObject({
      code: 'balance_insufficient',
    });

    const transfer = await sdk().transfers.create({
      amount: 4_600,
      currency: 'eur',
      destination: account.id,
      source_transaction: paymentIntent.latest_charge as string,
    });
    expect(transfer.source_transaction).toBe(paymentIntent.latest_charge);
    expect(await sdk().balance.retrieve({}, { stripeAccount: account.id })).toMatchObject({ available: eur(0), pending: eur(4_600) });
    expect(await sdk().balance.retrieve()).toMatchObject({ available: eur(0), pending: eur(400) });
    await expect(
      sdk().transfers.create({
        amount: 401,
        currency: 'eur',
        destination: account.id,
        source_transaction: paymentIntent.latest_charge as string,
      }),
    ).rejects.toMatchObject({ code: 'balance_insufficient', param: 'amount' });
  });
});

describe('payments fake: payouts', () => {
  async function fundedAccount(amount: number): Promise<Stripe.Account> {
    const account = await onboardedAccount();
    await paidPaymentIntent(amount);
    await sdk().transfers.create({ amount, currency: 'eur', destination: account.id });
    return account;
  }

  test('a payout is pending, then paid after the delay, with payout.paid carrying the account', async () => {
    const receiver = await startReceiver();
    await start({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, payoutDelayMs: 300 });
    const account = await fundedAccount(30_000);

    const payout = await sdk().payouts.create({ amount: 25_000, currency: 'eur' }, { stripeAccount: account.id });
    expect(payout).toMatchObject({
      object: 'payout',
      amount: 25_000,
      currency: 'eur',
      status: 'pending',
      method: 'standard',
      automatic: false,
    });
    expect(payout.id).toMatch(/^po_/);
    expect(payout.destination).toBe(account.external_accounts?.data[0]?.id);
    expect((await sdk().balance.retrieve({}, { stripeAccount: account.id })).available).toEqual(eur(5_000));

    await waitFor(async () => (await sdk().payouts.retrieve(payout.id, {}, { stripeAccount: account.id })).status === 'paid');
    await waitFor(() => receiver.events().some((event) => event.type === 'payout.paid'));
    const paid = receiver.events().find((event) => event.type === 'payout.paid');
    expect(paid).toMatchObject({
      account: account.id,
      data: { object: { id: payout.id, status: 'paid' }, previous_attributes: { status: 'pending' } },
    });
    expect(receiver.events().find((event) => event.type === 'payout.created')?.account).toBe(account.id);

    const listed = await sdk().payouts.list({ status: 'paid' }, { stripeAccount: account.id });
    expect(listed.data.map((entry) => entry.id)).toEqual([payout.id]);
    const connectedEvents = await sdk().events.list({ type: 'payout.*' }, { stripeAccount: account.id });
    expect(connectedEvents.data.map((event) => event.type)).toEqual(['payout.paid', 'payout.updated', 'payout.created']);
    expect((await sdk().events.list({ type: 'payout.*' })).data).toHaveLength(0);
    await expect(sdk().payouts.retrieve(payout.id)).rejects.toMatchObject({ statusCode: 400 });
  });

  test(`a payout of ${FAILING_PAYOUT_AMOUNT} fails with payout.failed and its amount returns to the balance`, async () => {
    await start({ payoutDelayMs: 100 });
    const account = await fundedAccount(FAILING_PAYOUT_AMOUNT);
    const payout = await sdk().payouts.create({ amount: FAILING_PAYOUT_AMOUNT, currency: 'eur' }, { stripeAccount: account.id });
    expect((await sdk().balance.retrieve({}, { stripeAccount: account.id })).available).toEqual(eur(0));

    await waitFor(async () => (await sdk().payouts.retrieve(payout.id, {}, { stripeAccount: account.id })).status === 'failed');
    const failed = await sdk().payouts.retrieve(payout.id, {}, { stripeAccount: account.id });
    expect(failed).toMatchObject({ failure_code: 'could_not_process', failure_message: 'The bank could not process this payout.' });
    expect(failed.failure_balance_transaction).toMatch(/^txn_/);
    expect((await sdk().balance.retrieve({}, { stripeAccount: account.id })).available).toEqual(eur(FAILING_PAYOUT_AMOUNT));
    const [event] = (await sdk().events.list({ type: 'payout.failed' }, { stripeAccount: account.id })).data;
    expect(event).toMatchObject({ account: account.id, data: { object: { id: payout.id, status: 'failed' } } });
  });

  test('the failPayout option decides which payouts fail', async () => {
    await start({ payoutDelayMs: 50, failPayout: (payout) => (payout.metadata as Record<string, string>).fail === 'yes' });
    const account = await fundedAccount(2_000);
    const failing = await sdk().payouts.create(
      { amount: 1_000, currency: 'eur', metadata: { fail: 'yes' } },
      { stripeAccount: account.id },
    );
    const passing = await sdk().payouts.create({ amount: 1_000, currency: 'eur' }, { stripeAccount: account.id });
    await waitFor(async () => (await sdk().payouts.list({ status: 'pending' }, { stripeAccount: account.id })).data.length === 0);
    expect((await sdk().payouts.retrieve(failing.id, {}, { stripeAccount: account.id })).status).toBe('failed');
    expect((await sdk().payouts.retrieve(passing.id, {}, { stripeAccount: account.id })).status).toBe('paid');
  });

  test('refuses an account without payouts, more than the available balance, and the platform itself', async () => {
    await start();
    const unboarded = await createAccount();
    await expect(sdk().payouts.create({ amount: 100, currency: 'eur' }, { stripeAccount: unboarded.id })).rejects.toMatchObject({
      code: 'payouts_not_allowed',
    });
    const account = await fundedAccount(1_000);
    await expect(sdk().payouts.create({ amount: 1_001, currency: 'eur' }, { stripeAccount: account.id })).rejects.toMatchObject({
      code: 'balance_insufficient',
      message: expect.stringMatching(/^You have insufficient funds in your Stripe account for this transfer\./),
    });
    await expect(sdk().payouts.create({ amount: 100, currency: 'eur' })).rejects.toMatchObject({ statusCode: 400 });
  });

  test('a payout that fell due while the fake was stopped is paid on restart, and the rest is still there', async () => {
    await start({ payoutDelayMs: 400 });
    const account = await fundedAccount(8_000);
    const payout = await sdk().payouts.create({ amount: 8_000, currency: 'eur' }, { stripeAccount: account.id });
    await fake().stop();
    await new Promise((resolve) => setTimeout(resolve, 600));

    await start({ payoutDelayMs: 400 });
    expect((await sdk().payouts.retrieve(payout.id, {}, { stripeAccount: account.id })).status).toBe('paid');
    expect((await sdk().events.list({ type: 'payout.paid' }, { stripeAccount: account.id })).data).toHaveLength(1);
    expect(await sdk().accounts.retrieve(account.id)).toMatchObject({ payouts_enabled: true });
    expect((await sdk().transfers.list({ destination: account.id })).data).toHaveLength(1);
    expect((await sdk().balance.retrieve({}, { stripeAccount: account.id })).available).toEqual(eur(0));
  });
});
