import { requirePlatform } from '../access';
import type { StripeFakeContext } from '../context';
import { invalidRequest, resourceMissing } from '../errors';
import { eventRequest } from '../events';
import { newId, unixSeconds } from '../ids';
import { availableOnAfter, recordBalanceTransaction } from '../ledger';
import { fieldFilter, paginate, rangeFilter } from '../list';
import { formatAmount } from '../money';
import { Params } from '../params';
import type { Charge, PaymentIntent } from '../payments';
import type { FakeRequest, Router } from '../router';
import type { StripeObject } from '../state';

const REASONS = ['duplicate', 'fraudulent', 'requested_by_customer'] as const;

/** The charge a refund request points at, by `payment_intent` or `charge`, as the provider resolves it. */
function refundedCharge(params: Params, context: StripeFakeContext): Charge {
  const { state } = context;
  const paymentIntentId = params.string('payment_intent');
  const chargeId = params.string('charge');
  if (paymentIntentId !== undefined) {
    const paymentIntent = state.get<PaymentIntent>('payment_intent', paymentIntentId);
    if (!paymentIntent) throw resourceMissing('payment_intent', paymentIntentId, 'payment_intent', 400);
    const charge = paymentIntent.latest_charge ? state.get<Charge>('charge', paymentIntent.latest_charge) : undefined;
    if (paymentIntent.status !== 'succeeded' || !charge) {
      throw invalidRequest(`This PaymentIntent (${paymentIntent.id}) does not have a successful charge to refund.`, {
        param: 'payment_intent',
      });
    }
    if (chargeId !== undefined && chargeId !== charge.id) {
      throw invalidRequest(`The charge ${chargeId} does not belong to the PaymentIntent ${paymentIntent.id}.`, { param: 'charge' });
    }
    return charge;
  }
  if (chargeId === undefined) {
    throw invalidRequest('One of the following params should be provided for this request: payment_intent or charge.', {
      code: 'parameter_missing',
    });
  }
  const charge = state.get<Charge>('charge', chargeId);
  if (!charge) throw resourceMissing('charge', chargeId, 'charge', 400);
  if (charge.status !== 'succeeded')
    throw invalidRequest(`Charge ${charge.id} has not succeeded, so it cannot be refunded.`, { param: 'charge' });
  return charge;
}

function refundAmount(params: Params, charge: Charge): number {
  const remaining = charge.amount - charge.amount_refunded;
  if (remaining <= 0) throw invalidRequest(`Charge ${charge.id} has already been refunded.`, { code: 'charge_already_refunded' });
  const amount = params.integer('amount', { min: 1 }) ?? remaining;
  if (amount <= remaining) return amount;
  const asked = formatAmount(amount, charge.currency);
  throw invalidRequest(
    charge.amount_refunded === 0
      ? `Refund amount (${asked}) is greater than charge amount (${formatAmount(charge.amount, charge.currency)})`
      : `Refund amount (${asked}) is greater than unrefunded amount on charge (${formatAmount(remaining, charge.currency)})`,
    { code: 'amount_too_large', param: 'amount' },
  );
}

/** Refunds succeed at once and are taken from the platform's balance; the charge's totals follow. */
function createRefund(request: FakeRequest, context: StripeFakeContext): StripeObject {
  requirePlatform(request);
  const params = new Params(request.body).only(
    'amount',
    'charge',
    'instructions_email',
    'metadata',
    'payment_intent',
    'reason',
    'refund_application_fee',
    'reverse_transfer',
  );
  const charge = refundedCharge(params, context);
  const amount = refundAmount(params, charge);
  const reason = params.enum('reason', REASONS) ?? null;
  // Checked like the provider checks them, without effect: the fake has no application fees or destination charges.
  params.boolean('refund_application_fee');
  params.boolean('reverse_transfer');

  const id = newId('re');
  const refund = context.state.insert<StripeObject>({
    id,
    object: 'refund',
    amount,
    balance_transaction: recordBalanceTransaction(context.state, '', {
      amount: -amount,
      currency: charge.currency,
      type: 'refund',
      source: id,
      description: 'REFUND FOR CHARGE',
      availableOn: availableOnAfter(0),
    }).id,
    charge: charge.id,
    created: unixSeconds(),
    currency: charge.currency,
    customer: null,
    customer_account: null,
    destination_details: {
      card: { reference: null, reference_status: 'pending', reference_type: 'acquirer_reference_number', type: 'refund' },
      type: 'card',
    },
    metadata: params.metadata(),
    payment_intent: charge.payment_intent,
    payment_method: charge.payment_method,
    reason,
    receipt_number: null,
    source_transfer_reversal: null,
    status: 'succeeded',
    transfer_reversal: null,
  });

  const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
  charge.amount_refunded += amount;
  charge.refunded = charge.amount_refunded === charge.amount;
  const changed = Object.fromEntries(Object.entries(previous).filter(([field, value]) => charge[field] !== value));
  context.events.emit('refund.created', refund, { request: eventRequest(request) });
  context.events.emit('charge.refunded', charge, { request: eventRequest(request), previousAttributes: changed });
  return refund;
}

export function addRefundRoutes(router: Router<StripeFakeContext>): void {
  router.post('/v1/refunds', createRefund);

  router.get('/v1/refunds', (request, { state }) => {
    requirePlatform(request);
    const filters = [
      fieldFilter(request.query, 'charge'),
      fieldFilter(request.query, 'payment_intent'),
      rangeFilter(request.query, 'created'),
    ];
    const refunds = state.list('refund').filter((refund) => filters.every((keep) => keep(refund)));
    return paginate(refunds, request.query, '/v1/refunds', 'refund');
  });

  router.get('/v1/refunds/:id', (request, { state }) => {
    requirePlatform(request);
    const id = request.params.id ?? '';
    const refund = state.get('refund', id);
    if (!refund) throw resourceMissing('refund', id);
    return refund;
  });
}
