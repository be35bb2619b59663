import path from 'node:path';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { StripeFakeError } from '../../../fakes/stripe/errors';
import { expandResponse } from '../../../fakes/stripe/expand';
import { parseFormBody } from '../../../fakes/stripe/form-body';
import { rangeFilter } from '../../../fakes/stripe/list';
import { formatAmount } from '../../../fakes/stripe/money';
import { Params } from '../../../fakes/stripe/params';
import { StateStore } from '../../../fakes/stripe/state';
import { makeTempDir } from '../../integration/fakes/temp-dir';

function refusal(run: () => unknown): StripeFakeError {
  try {
    run();
  } catch (error) {
    if (error instanceof StripeFakeError) return error;
    throw error;
  }
  throw new Error('expected a StripeFakeError');
}

function params(encoded: string): Params {
  return new Params(parseFormBody(encoded));
}

describe('payments fake: parameters', () => {
  test('coerces wire strings and names nested parameters in errors', () => {
    const body = params('amount=2500&capture=true&line_items[0][quantity]=x&metadata[a]=1&metadata[b]=');
    expect(body.requiredInteger('amount', { min: 1 })).toBe(2_500);
    expect(body.boolean('capture')).toBe(true);
    expect(body.metadata()).toEqual({ a: '1' });
    const [item] = body.hashes('line_items') ?? [];
    expect(refusal(() => item?.integer('quantity')).body).toMatchObject({
      message: 'Invalid integer: x',
      param: 'line_items[0][quantity]',
    });
    expect(refusal(() => item?.requiredString('price')).body).toMatchObject({
      message: 'Missing required param: line_items[0][price].',
      code: 'parameter_missing',
    });
  });

  test('refuses unknown keys but always takes expand at the top', () => {
    expect(() => params('amount=1&expand[0]=charge').only('amount')).not.toThrow();
    expect(refusal(() => params('amount=1&amout=2').only('amount')).body).toMatchObject({
      code: 'parameter_unknown',
      message: 'Received unknown parameter: amout',
    });
  });

  test('refuses values out of range, bad enums, URLs and currencies', () => {
    expect(refusal(() => params('amount=0').integer('amount', { min: 1 })).body.message).toBe(
      'This value must be greater than or equal to 1.',
    );
    expect(refusal(() => params('reason=oops').enum('reason', ['duplicate', 'fraudulent'])).body.message).toBe(
      'Invalid reason: must be one of duplicate, fraudulent',
    );
    expect(refusal(() => params('success_url=javascript:alert(1)').url('success_url')).body.param).toBe('success_url');
    expect(refusal(() => params('success_url=http://shop.test/%0D%0ASet-Cookie:x').url('success_url')).body.message).toBe(
      'Not a valid URL',
    );
    expect(params('success_url=http://shop.test/paid?s={CHECKOUT_SESSION_ID}').url('success_url')).toBe(
      'http://shop.test/paid?s={CHECKOUT_SESSION_ID}',
    );
    expect(refusal(() => params('currency=xyz').currency('currency')).body.message).toBe('Invalid currency: xyz.');
    expect(params('currency=EUR').currency('currency')).toBe('eur');
  });

  test('created filters take one timestamp or a range', () => {
    const items = [1, 2, 3].map((created) => ({ id: `x_${created}`, object: 'x', created }));
    expect(items.filter(rangeFilter(parseFormBody('created[gte]=2&created[lt]=3'), 'created')).map((item) => item.created)).toEqual([2]);
    expect(items.filter(rangeFilter(parseFormBody('created=3'), 'created')).map((item) => item.created)).toEqual([3]);
    expect(refusal(() => rangeFilter(parseFormBody('created[around]=3'), 'created')).body.code).toBe('parameter_unknown');
  });

  test('amounts in messages are written as the provider writes them', () => {
    expect(formatAmount(12_000, 'eur')).toBe('€120.00');
    expect(formatAmount(2_145, 'usd')).toBe('$21.45');
    expect(formatAmount(5_000, 'jpy')).toBe('¥5,000');
  });
});

describe('payments fake: expand', () => {
  let temp: Awaited<ReturnType<typeof makeTempDir>>;
  let state: StateStore;

  beforeEach(async () => {
    temp = await makeTempDir();
    state = StateStore.open(path.join(temp.dir, 'state.json'));
    state.insert({ id: 'pi_1', object: 'payment_intent', latest_charge: 'ch_1' });
    state.insert({ id: 'ch_1', object: 'charge', amount: 100 });
    state.insert({ id: 'po_1', object: 'payout', balance_transaction: 'txn_1' }, 'acct_1');
    state.insert({ id: 'txn_1', object: 'balance_transaction', amount: -100 }, 'acct_1');
  });

  afterEach(() => temp.remove());

  const source = (account = '') => ({
    state,
    account,
    virtualFields: { 'checkout.session.line_items': () => ({ object: 'list', data: [] }) },
  });

  test('replaces ids by copies of their objects, through nested paths and list items', () => {
    const body = { object: 'list', data: [{ id: 'cs_test_1', object: 'checkout.session', payment_intent: 'pi_1' }] };
    expandResponse(body, ['data.payment_intent.latest_charge', 'data.line_items'], source());
    expect(body.data[0]).toEqual({
      id: 'cs_test_1',
      object: 'checkout.session',
      payment_intent: { id: 'pi_1', object: 'payment_intent', latest_charge: { id: 'ch_1', object: 'charge', amount: 100 } },
      line_items: { object: 'list', data: [] },
    });
    expect(state.get('payment_intent', 'pi_1')?.latest_charge).toBe('ch_1');
  });

  test("resolves a connected account's objects on that account only", () => {
    const payout = { id: 'po_1', object: 'payout', balance_transaction: 'txn_1', failure_balance_transaction: null };
    expandResponse(payout, ['balance_transaction', 'failure_balance_transaction'], source('acct_1'));
    expect(payout.balance_transaction).toMatchObject({ amount: -100 });
    expect(payout.failure_balance_transaction).toBeNull();
    expect(
      refusal(() => expandResponse({ id: 'po_1', object: 'payout', balance_transaction: 'txn_1' }, ['balance_transaction'], source())).body
        .message,
    ).toBe('This property cannot be expanded (balance_transaction).');
  });

  test('refuses fields that are no id', () => {
    expect(refusal(() => expandResponse({ object: 'charge', amount: 100 }, ['amount'], source())).body).toMatchObject({ param: 'expand' });
    expect(refusal(() => expandResponse({ object: 'list', data: [] }, ['data'], source())).body.message).toBe(
      'This property cannot be expanded (data).',
    );
  });
});
