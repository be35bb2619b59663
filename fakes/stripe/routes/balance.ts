import type { ConnectedAccount } from '../connect';
import type { StripeFakeContext } from '../context';
import { resourceMissing } from '../errors';
import { balanceOf, balanceTransactions } from '../ledger';
import { fieldFilter, paginate, rangeFilter } from '../list';
import type { FakeRequest, Router } from '../router';

function defaultCurrency(request: FakeRequest, { state, settings }: StripeFakeContext): string {
  if (request.account === '') return settings.platformCurrency;
  return state.get<ConnectedAccount>('account', request.account)?.default_currency ?? settings.platformCurrency;
}

/** The balance of the platform, or of the connected account named by `Stripe-Account`. */
export function addBalanceRoutes(router: Router<StripeFakeContext>): void {
  router.get('/v1/balance', (request, context) => balanceOf(context.state, request.account, defaultCurrency(request, context)));

  router.get('/v1/balance_transactions', (request, { state }) => {
    const filters = [
      fieldFilter(request.query, 'type'),
      fieldFilter(request.query, 'source'),
      fieldFilter(request.query, 'currency'),
      rangeFilter(request.query, 'created'),
    ];
    const transactions = balanceTransactions(state, request.account).filter((transaction) => filters.every((keep) => keep(transaction)));
    return paginate(transactions, request.query, '/v1/balance_transactions', 'balance_transaction');
  });

  router.get('/v1/balance_transactions/:id', (request, { state }) => {
    const id = request.params.id ?? '';
    const transaction = balanceTransactions(state, request.account).find((candidate) => candidate.id === id);
    if (!transaction) throw resourceMissing('balance_transaction', id);
    return transaction;
  });
}
