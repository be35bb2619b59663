import { requirePlatform } from '../access';
import type { ConnectedAccount } from '../connect';
import type { StripeFakeContext } from '../context';
import { invalidRequest, resourceMissing } from '../errors';
import { eventRequest } from '../events';
import { newId, unixSeconds } from '../ids';
import { availableAmount, availableOnAfter, balanceTransactions, recordBalanceTransaction } from '../ledger';
import { fieldFilter, paginate, rangeFilter } from '../list';
import { formatAmount } from '../money';
import { Params } from '../params';
import type { Charge } from '../payments';
import type { FakeRequest, Router } from '../router';
import type { StripeObject } from '../state';

interface Transfer extends StripeObject {
  object: 'transfer';
  amount: number;
  source_transaction: string | null;
}

const INSUFFICIENT_FUNDS =
  'You have insufficient available funds in your Stripe account. Try adding funds directly to your available balance by creating Charges using the 4000000000000077 test card. See: https://stripe.com/docs/testing#available-balance';

function destinationAccount(params: Params, context: StripeFakeContext): ConnectedAccount {
  const id = params.requiredString('destination');
  const account = context.state.get<ConnectedAccount>('account', id);
  if (!account) throw resourceMissing('destination', id, 'destination', 400);
  if (account.capabilities.transfers !== 'active') {
    throw invalidRequest(
      'Your destination account needs to have at least one of the following capabilities enabled: transfers, crypto_transfers, legacy_payments',
      { code: 'insufficient_capabilities_for_transfer', param: 'destination' },
    );
  }
  return account;
}

/**
 * With `source_transaction` the money comes from that charge (pending or not) and becomes
 * available when the charge's does; without it the platform's available balance must cover it.
 */
function fundingAvailableOn(
  params: Params,
  context: StripeFakeContext,
  amount: number,
  currency: string,
): { source: Charge | null; availableOn: number } {
  const sourceId = params.string('source_transaction');
  if (sourceId === undefined) {
    if (availableAmount(context.state, '', currency) < amount) {
      throw invalidRequest(INSUFFICIENT_FUNDS, { code: 'balance_insufficient' });
    }
    return { source: null, availableOn: availableOnAfter(0) };
  }
  const charge = context.state.get<Charge>('charge', sourceId);
  if (!charge) throw resourceMissing('charge', sourceId, 'source_transaction', 400);
  if (charge.status !== 'succeeded') {
    throw invalidRequest(`The source transaction ${charge.id} has not succeeded.`, { param: 'source_transaction' });
  }
  if (charge.currency !== currency) {
    throw invalidRequest(
      `The currency of source_transaction's balance transaction (${charge.currency}) must be the same as the transfer currency (${currency}).`,
      {
        param: 'currency',
      },
    );
  }
  const transferred = context.state
    .list<Transfer>('transfer')
    .filter((transfer) => transfer.source_transaction === charge.id)
    .reduce((sum, transfer) => sum + transfer.amount, 0);
  const left = charge.amount - charge.amount_refunded - transferred;
  if (amount > left) {
    throw invalidRequest(
      `The transfer amount (${formatAmount(amount, currency)}) is greater than what is left of the source transaction ${charge.id} (${formatAmount(left, currency)}).`,
      { code: 'balance_insufficient', param: 'amount' },
    );
  }
  const chargeTransaction = balanceTransactions(context.state, '').find((transaction) => transaction.source === charge.id);
  return { source: charge, availableOn: chargeTransaction?.available_on ?? availableOnAfter(0) };
}

function createTransfer(request: FakeRequest, context: StripeFakeContext): Transfer {
  requirePlatform(request);
  const params = new Params(request.body).only(
    'amount',
    'currency',
    'description',
    'destination',
    'metadata',
    'source_transaction',
    'source_type',
    'transfer_group',
  );
  const amount = params.requiredInteger('amount', { min: 1 });
  const currency = params.requiredCurrency('currency');
  const destination = destinationAccount(params, context);
  // Checked, without effect: every balance on the fake comes from cards.
  params.enum('source_type', ['bank_account', 'card', 'fpx']);
  const { source, availableOn } = fundingAvailableOn(params, context, amount, currency);

  const id = newId('tr');
  const payment = newId('py');
  const description = params.string('description') ?? null;
  const transfer = context.state.insert<Transfer>({
    id,
    object: 'transfer',
    amount,
    amount_reversed: 0,
    balance_transaction: recordBalanceTransaction(context.state, '', {
      amount: -amount,
      currency,
      type: 'transfer',
      source: id,
      description,
      availableOn,
    }).id,
    created: unixSeconds(),
    currency,
    description,
    destination: destination.id,
    destination_payment: payment,
    livemode: false,
    metadata: params.metadata(),
    reversals: { object: 'list', data: [], has_more: false, total_count: 0, url: `/v1/transfers/${id}/reversals` },
    reversed: false,
    source_transaction: source?.id ?? null,
    source_type: 'card',
    transfer_group: params.string('transfer_group') ?? null,
  });
  recordBalanceTransaction(context.state, destination.id, { amount, currency, type: 'payment', source: payment, description, availableOn });
  context.events.emit('transfer.created', transfer, { request: eventRequest(request) });
  return transfer;
}

export function addTransferRoutes(router: Router<StripeFakeContext>): void {
  router.post('/v1/transfers', createTransfer);

  router.get('/v1/transfers', (request, { state }) => {
    requirePlatform(request);
    const filters = [
      fieldFilter(request.query, 'destination'),
      fieldFilter(request.query, 'transfer_group'),
      rangeFilter(request.query, 'created'),
    ];
    const transfers = state.list<Transfer>('transfer').filter((transfer) => filters.every((keep) => keep(transfer)));
    return paginate(transfers, request.query, '/v1/transfers', 'transfer');
  });

  router.get('/v1/transfers/:id', (request, { state }) => {
    requirePlatform(request);
    const id = request.params.id ?? '';
    const transfer = state.get<Transfer>('transfer', id);
    if (!transfer) throw resourceMissing('transfer', id);
    return transfer;
  });
}
