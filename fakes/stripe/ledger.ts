import { newId, unixSeconds } from './ids';
import type { StateStore, StripeObject } from './state';

export type BalanceTransactionType = 'charge' | 'refund' | 'transfer' | 'payment' | 'payout' | 'payout_failure';

export interface BalanceTransaction extends StripeObject {
  object: 'balance_transaction';
  amount: number;
  /** Unix seconds from which the amount counts as available rather than pending. */
  available_on: number;
  created: number;
  currency: string;
  net: number;
  source: string;
  status: 'available' | 'pending';
  type: BalanceTransactionType;
}

interface BalanceAmount {
  amount: number;
  currency: string;
  source_types: { card: number };
}

export interface BalanceObject {
  object: 'balance';
  available: BalanceAmount[];
  pending: BalanceAmount[];
  livemode: false;
}

const REPORTING_CATEGORIES: Record<BalanceTransactionType, string> = {
  charge: 'charge',
  refund: 'refund',
  transfer: 'transfer',
  payment: 'charge',
  payout: 'payout',
  payout_failure: 'payout_reversal',
};

/** `available_on` for money that becomes available `delayMs` from now, rounded up to whole seconds. */
export function availableOnAfter(delayMs: number, nowMs = Date.now()): number {
  if (delayMs <= 0) return Math.floor(nowMs / 1000);
  return Math.ceil((nowMs + delayMs) / 1000);
}

function refreshStatus(transaction: BalanceTransaction, nowMs: number): BalanceTransaction {
  if (transaction.status === 'pending' && transaction.available_on * 1000 <= nowMs) transaction.status = 'available';
  return transaction;
}

/**
 * Every movement of money on an account is a balance transaction, as on the provider; the balance
 * is their sum. Fees are left out: `net` equals `amount`.
 */
export function recordBalanceTransaction(
  state: StateStore,
  account: string,
  entry: {
    amount: number;
    currency: string;
    type: BalanceTransactionType;
    source: string;
    description: string | null;
    availableOn: number;
  },
): BalanceTransaction {
  const created = unixSeconds();
  return refreshStatus(
    state.insert<BalanceTransaction>(
      {
        id: newId('txn'),
        object: 'balance_transaction',
        amount: entry.amount,
        available_on: Math.max(entry.availableOn, created),
        balance_type: 'payments',
        created,
        currency: entry.currency,
        description: entry.description,
        exchange_rate: null,
        fee: 0,
        fee_details: [],
        net: entry.amount,
        reporting_category: REPORTING_CATEGORIES[entry.type],
        source: entry.source,
        status: 'pending',
        type: entry.type,
      },
      account,
    ),
    Date.now(),
  );
}

/** An account's balance transactions, newest first, with `status` brought up to date. */
export function balanceTransactions(state: StateStore, account: string, nowMs = Date.now()): BalanceTransaction[] {
  return state.list<BalanceTransaction>('balance_transaction', account).map((transaction) => refreshStatus(transaction, nowMs));
}

export function availableAmount(state: StateStore, account: string, currency: string): number {
  return balanceTransactions(state, account)
    .filter((transaction) => transaction.currency === currency && transaction.status === 'available')
    .reduce((sum, transaction) => sum + transaction.net, 0);
}

/** The balance object: available and pending per currency, the account's default currency always listed. */
export function balanceOf(state: StateStore, account: string, defaultCurrency: string): BalanceObject {
  const sums = new Map<string, { available: number; pending: number }>([[defaultCurrency, { available: 0, pending: 0 }]]);
  for (const transaction of balanceTransactions(state, account)) {
    const sum = sums.get(transaction.currency) ?? { available: 0, pending: 0 };
    sum[transaction.status === 'available' ? 'available' : 'pending'] += transaction.net;
    sums.set(transaction.currency, sum);
  }
  const amounts = (kind: 'available' | 'pending') =>
    [...sums].map(([currency, sum]) => ({ amount: sum[kind], currency, source_types: { card: sum[kind] } }));
  return { object: 'balance', available: amounts('available'), pending: amounts('pending'), livemode: false };
}
