import { requireConnectedAccount } from '../access';
import type { ConnectedAccount } from '../connect';
import type { StripeFakeContext } from '../context';
import { invalidRequest, resourceMissing } from '../errors';
import { eventRequest } from '../events';
import { newId, unixSeconds } from '../ids';
import { availableAmount, availableOnAfter, recordBalanceTransaction } from '../ledger';
import { fieldFilter, paginate, rangeFilter } from '../list';
import { Params } from '../params';
import type { FakeRequest, Router } from '../router';
import type { ScheduledJob, StripeObject } from '../state';

interface Payout extends StripeObject {
  object: 'payout';
  amount: number;
  currency: string;
  status: 'pending' | 'paid' | 'failed';
}

/** Minor units of a payout that fails when it falls due, unless `failPayout` decides otherwise. */
export const FAILING_PAYOUT_AMOUNT = 400_002;

const INSUFFICIENT_FUNDS =
  'You have insufficient funds in your Stripe account for this transfer. Your card balance is too low.  You can use the /v1/balance endpoint to view your Stripe balance (for more details, see stripe.com/docs/api#balance).';
const PAYOUTS_NOT_ALLOWED =
  "Payouts have been disabled on the connected account. Check the connected account's status to see if any additional information needs to be provided, or if payouts have been disabled for another reason.";

function payoutDestination(params: Params, account: ConnectedAccount, currency: string): StripeObject {
  const banks = account.external_accounts.data;
  const id = params.string('destination');
  const bank =
    id === undefined
      ? (banks.find((candidate) => candidate.currency === currency) ?? banks[0])
      : banks.find((candidate) => candidate.id === id);
  if (!bank) throw resourceMissing('external account', id ?? '', 'destination', 400);
  return bank;
}

function createPayout(request: FakeRequest, context: StripeFakeContext): Payout {
  const accountId = requireConnectedAccount(request);
  const account = context.state.get<ConnectedAccount>('account', accountId);
  if (!account) throw new Error(`connected account ${accountId} passed the header check but is not stored`);
  const params = new Params(request.body).only(
    'amount',
    'currency',
    'description',
    'destination',
    'metadata',
    'method',
    'source_type',
    'statement_descriptor',
  );
  const amount = params.requiredInteger('amount', { min: 1 });
  const currency = params.requiredCurrency('currency');
  if (params.enum('method', ['instant', 'standard']) === 'instant') {
    throw invalidRequest("The payments fake makes standard payouts only; leave out method or send 'standard'.", { param: 'method' });
  }
  // Checked, without effect: every balance on the fake comes from cards.
  params.enum('source_type', ['bank_account', 'card', 'fpx']);
  if (!account.payouts_enabled) throw invalidRequest(PAYOUTS_NOT_ALLOWED, { code: 'payouts_not_allowed' });
  const bank = payoutDestination(params, account, currency);
  if (availableAmount(context.state, accountId, currency) < amount) {
    throw invalidRequest(INSUFFICIENT_FUNDS, { code: 'balance_insufficient', param: 'amount' });
  }

  const id = newId('po');
  const dueAtMs = Date.now() + context.settings.payoutDelayMs;
  const description = params.string('description') ?? null;
  const payout = context.state.insert<Payout>(
    {
      id,
      object: 'payout',
      amount,
      application_fee: null,
      application_fee_amount: null,
      arrival_date: Math.ceil(dueAtMs / 1000),
      automatic: false,
      balance_transaction: recordBalanceTransaction(context.state, accountId, {
        amount: -amount,
        currency,
        type: 'payout',
        source: id,
        description,
        availableOn: availableOnAfter(0),
      }).id,
      created: unixSeconds(),
      currency,
      description,
      destination: bank.id,
      failure_balance_transaction: null,
      failure_code: null,
      failure_message: null,
      livemode: false,
      metadata: params.metadata(),
      method: 'standard',
      original_payout: null,
      payout_method: null,
      reconciliation_status: 'not_applicable',
      reversed_by: null,
      source_type: 'card',
      statement_descriptor: params.string('statement_descriptor') ?? null,
      status: 'pending',
      trace_id: { status: 'pending', value: null },
      type: 'bank_account',
    },
    accountId,
  );
  context.scheduler.schedule('settle_payout', id, accountId, dueAtMs);
  context.events.emit('payout.created', payout, { account: accountId, request: eventRequest(request) });
  return payout;
}

/** When a payout falls due it is paid, or fails and its amount returns to the available balance. */
export function settlePayout(context: StripeFakeContext, job: ScheduledJob): void {
  const payout = context.state.get<Payout>('payout', job.objectId, job.account);
  if (payout?.status !== 'pending') return;
  const options = { account: job.account, previousAttributes: { status: 'pending' } };
  if (!context.settings.failPayout(payout, job.account)) {
    Object.assign(payout, { status: 'paid', trace_id: { status: 'supported', value: `FAKE${payout.id.slice(3, 15).toUpperCase()}` } });
    context.events.emit('payout.updated', payout, options);
    context.events.emit('payout.paid', payout, options);
    return;
  }
  const reversal = recordBalanceTransaction(context.state, job.account, {
    amount: payout.amount,
    currency: payout.currency,
    type: 'payout_failure',
    source: payout.id,
    description: 'Payout failure',
    availableOn: availableOnAfter(0),
  });
  Object.assign(payout, {
    failure_balance_transaction: reversal.id,
    failure_code: 'could_not_process',
    failure_message: 'The bank could not process this payout.',
    status: 'failed',
    trace_id: { status: 'unsupported', value: null },
  });
  context.events.emit('payout.updated', payout, options);
  context.events.emit('payout.failed', payout, options);
}

export function addPayoutRoutes(router: Router<StripeFakeContext>): void {
  router.post('/v1/payouts', createPayout);

  router.get('/v1/payouts', (request, { state }) => {
    const account = requireConnectedAccount(request);
    const filters = [
      fieldFilter(request.query, 'status'),
      fieldFilter(request.query, 'destination'),
      rangeFilter(request.query, 'created'),
      rangeFilter(request.query, 'arrival_date'),
    ];
    const payouts = state.list<Payout>('payout', account).filter((payout) => filters.every((keep) => keep(payout)));
    return paginate(payouts, request.query, '/v1/payouts', 'payout');
  });

  router.get('/v1/payouts/:id', (request, { state }) => {
    const account = requireConnectedAccount(request);
    const id = request.params.id ?? '';
    const payout = state.get<Payout>('payout', id, account);
    if (!payout) throw resourceMissing('payout', id);
    return payout;
  });
}
