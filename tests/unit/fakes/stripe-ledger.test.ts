import path from 'node:path';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { availableAmount, availableOnAfter, balanceOf, recordBalanceTransaction } from '../../../fakes/stripe/ledger';
import { StateStore } from '../../../fakes/stripe/state';
import { makeTempDir } from '../../integration/fakes/temp-dir';

let temp: Awaited<ReturnType<typeof makeTempDir>>;
let state: StateStore;

beforeEach(async () => {
  temp = await makeTempDir();
  state = StateStore.open(path.join(temp.dir, 'state.json'));
});

afterEach(() => temp.remove());

function record(account: string, amount: number, currency: string, availableOn: number) {
  return recordBalanceTransaction(state, account, {
    amount,
    currency,
    type: amount > 0 ? 'charge' : 'refund',
    source: 'ch_1',
    description: null,
    availableOn,
  });
}

describe('payments fake: balances from balance transactions', () => {
  test('money is pending until available_on, then available; fees stay out', () => {
    const now = Date.now();
    const later = record('', 5_000, 'eur', availableOnAfter(60_000, now));
    record('', 2_000, 'eur', availableOnAfter(0, now));
    expect(later).toMatchObject({ object: 'balance_transaction', status: 'pending', fee: 0, net: 5_000, reporting_category: 'charge' });
    expect(later.id).toMatch(/^txn_/);
    expect(balanceOf(state, '', 'eur')).toEqual({
      object: 'balance',
      available: [{ amount: 2_000, currency: 'eur', source_types: { card: 2_000 } }],
      pending: [{ amount: 5_000, currency: 'eur', source_types: { card: 5_000 } }],
      livemode: false,
    });
    later.available_on = Math.floor(now / 1000) - 1;
    expect(availableAmount(state, '', 'eur')).toBe(7_000);
  });

  test('keeps currencies and accounts apart, always listing the default currency', () => {
    record('', 1_000, 'usd', availableOnAfter(0));
    record('acct_1', 300, 'eur', availableOnAfter(0));
    record('acct_1', -100, 'eur', availableOnAfter(0));
    expect(balanceOf(state, '', 'eur').available).toEqual([
      { amount: 0, currency: 'eur', source_types: { card: 0 } },
      { amount: 1_000, currency: 'usd', source_types: { card: 1_000 } },
    ]);
    expect(availableAmount(state, 'acct_1', 'eur')).toBe(200);
    expect(availableAmount(state, 'acct_1', 'usd')).toBe(0);
  });

  test('availableOnAfter rounds a delay up to whole seconds and leaves no delay at the current second', () => {
    expect(availableOnAfter(0, 1_700_000_000_500)).toBe(1_700_000_000);
    expect(availableOnAfter(200, 1_700_000_000_900)).toBe(1_700_000_002);
  });
});
