import type { CardBehaviour, CheckedCard } from './cards';
import type { StripeFakeContext } from './context';
import type { StripeErrorBody } from './errors';
import { newId, randomToken, unixSeconds } from './ids';
import { availableOnAfter, recordBalanceTransaction } from './ledger';
import type { StripeObject } from './state';

export interface PaymentIntent extends StripeObject {
  object: 'payment_intent';
  amount: number;
  amount_received: number;
  currency: string;
  description: string | null;
  last_payment_error: Record<string, unknown> | null;
  latest_charge: string | null;
  metadata: Record<string, string>;
  next_action: Record<string, unknown> | null;
  payment_method: string | null;
  status: 'requires_payment_method' | 'requires_action' | 'succeeded' | 'canceled';
  transfer_group: string | null;
}

export interface Charge extends StripeObject {
  object: 'charge';
  amount: number;
  amount_refunded: number;
  currency: string;
  payment_intent: string | null;
  refunded: boolean;
  status: 'succeeded' | 'failed';
  transfer_group: string | null;
}

export interface PaymentMethod extends StripeObject {
  object: 'payment_method';
  card: { brand: string; last4: string; exp_month: number; exp_year: number; fingerprint: string; [field: string]: unknown };
}

export interface Billing {
  name: string | null;
  email: string | null;
}

const AUTHENTICATION_FAILED =
  'The provided PaymentMethod has failed authentication. You can provide payment_method_data or a new PaymentMethod to attempt to fulfill this PaymentIntent again.';

function docUrl(code: string): string {
  return `https://stripe.com/docs/error-codes/${code.replace(/_/g, '-')}`;
}

/** A PaymentIntent as Checkout makes one when the buyer first tries to pay. */
export function createPaymentIntent(
  { state, events }: StripeFakeContext,
  fields: { amount: number; currency: string; metadata: Record<string, string>; transferGroup: string | null; description: string | null },
): PaymentIntent {
  const id = newId('pi');
  const paymentIntent = state.insert<PaymentIntent>({
    id,
    object: 'payment_intent',
    amount: fields.amount,
    amount_capturable: 0,
    amount_details: { tip: {} },
    amount_received: 0,
    application: null,
    application_fee_amount: null,
    automatic_payment_methods: null,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: 'automatic_async',
    client_secret: `${id}_secret_${randomToken(25)}`,
    confirmation_method: 'automatic',
    created: unixSeconds(),
    currency: fields.currency,
    customer: null,
    customer_account: null,
    description: fields.description,
    excluded_payment_method_types: null,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    metadata: { ...fields.metadata },
    next_action: null,
    on_behalf_of: null,
    payment_method: null,
    payment_method_configuration_details: null,
    payment_method_options: { card: { installments: null, mandate_options: null, network: null, request_three_d_secure: 'automatic' } },
    payment_method_types: ['card'],
    processing: null,
    receipt_email: null,
    review: null,
    setup_future_usage: null,
    shipping: null,
    source: null,
    statement_descriptor: null,
    statement_descriptor_suffix: null,
    status: 'requires_payment_method',
    transfer_data: null,
    transfer_group: fields.transferGroup,
  });
  events.emit('payment_intent.created', paymentIntent);
  return paymentIntent;
}

export function createCardPaymentMethod({ state }: StripeFakeContext, card: CheckedCard, billing: Billing): PaymentMethod {
  return state.insert<PaymentMethod>({
    id: newId('pm'),
    object: 'payment_method',
    allow_redisplay: 'unspecified',
    billing_details: {
      address: { city: null, country: null, line1: null, line2: null, postal_code: null, state: null },
      email: billing.email,
      name: billing.name,
      phone: null,
      tax_id: null,
    },
    card: {
      brand: card.brand,
      checks: { address_line1_check: null, address_postal_code_check: null, cvc_check: 'pass' },
      country: 'US',
      display_brand: card.brand,
      exp_month: card.expMonth,
      exp_year: card.expYear,
      fingerprint: card.fingerprint,
      funding: 'credit',
      generated_from: null,
      last4: card.last4,
      networks: { available: [card.brand], preferred: null },
      regulated_status: 'unregulated',
      three_d_secure_usage: { supported: true },
      wallet: null,
    },
    created: unixSeconds(),
    customer: null,
    customer_account: null,
    livemode: false,
    metadata: {},
    type: 'card',
  });
}

function createCharge(
  { state }: StripeFakeContext,
  paymentIntent: PaymentIntent,
  paymentMethod: PaymentMethod,
  result: { succeeded: true; authenticated: boolean } | { succeeded: false; declineCode: string; message: string },
): Charge {
  const billing = paymentMethod.billing_details as Record<string, unknown>;
  return state.insert<Charge>({
    id: newId('ch'),
    object: 'charge',
    amount: paymentIntent.amount,
    amount_captured: result.succeeded ? paymentIntent.amount : 0,
    amount_refunded: 0,
    application: null,
    application_fee: null,
    application_fee_amount: null,
    balance_transaction: null,
    billing_details: { ...billing },
    calculated_statement_descriptor: 'LIGHTYARD',
    captured: result.succeeded,
    created: unixSeconds(),
    currency: paymentIntent.currency,
    customer: null,
    description: paymentIntent.description,
    disputed: false,
    failure_balance_transaction: null,
    failure_code: result.succeeded ? null : 'card_declined',
    failure_message: result.succeeded ? null : result.message,
    fraud_details: {},
    livemode: false,
    metadata: { ...paymentIntent.metadata },
    on_behalf_of: null,
    outcome: result.succeeded
      ? {
          advice_code: null,
          network_advice_code: null,
          network_decline_code: null,
          network_status: 'approved_by_network',
          reason: null,
          risk_level: 'normal',
          risk_score: 20,
          seller_message: 'Payment complete.',
          type: 'authorized',
        }
      : {
          advice_code: 'try_again_later',
          network_advice_code: null,
          network_decline_code: null,
          network_status: 'declined_by_network',
          reason: result.declineCode,
          risk_level: 'normal',
          risk_score: 20,
          seller_message:
            result.declineCode === 'generic_decline'
              ? 'The bank did not return any further details with this decline.'
              : `The bank returned the decline code \`${result.declineCode}\`.`,
          type: 'issuer_declined',
        },
    paid: result.succeeded,
    payment_intent: paymentIntent.id,
    payment_method: paymentMethod.id,
    payment_method_details: {
      card: {
        amount_authorized: result.succeeded ? paymentIntent.amount : null,
        brand: paymentMethod.card.brand,
        checks: { address_line1_check: null, address_postal_code_check: null, cvc_check: 'pass' },
        country: 'US',
        exp_month: paymentMethod.card.exp_month,
        exp_year: paymentMethod.card.exp_year,
        fingerprint: paymentMethod.card.fingerprint,
        funding: 'credit',
        last4: paymentMethod.card.last4,
        network: paymentMethod.card.brand,
        three_d_secure:
          result.succeeded && result.authenticated
            ? { authentication_flow: 'challenge', result: 'authenticated', result_reason: null, version: '2.2.0' }
            : null,
        wallet: null,
      },
      type: 'card',
    },
    receipt_email: null,
    receipt_number: null,
    receipt_url: null,
    refunded: false,
    review: null,
    shipping: null,
    source: null,
    source_transfer: null,
    statement_descriptor: null,
    statement_descriptor_suffix: null,
    status: result.succeeded ? 'succeeded' : 'failed',
    transfer_data: null,
    transfer_group: paymentIntent.transfer_group,
  });
}

/** The card is charged: a succeeded Charge, the money on the platform's balance, the intent succeeded. */
export function succeedPayment(
  context: StripeFakeContext,
  paymentIntent: PaymentIntent,
  paymentMethod: PaymentMethod,
  { authenticated }: { authenticated: boolean },
): Charge {
  const charge = createCharge(context, paymentIntent, paymentMethod, { succeeded: true, authenticated });
  charge.balance_transaction = recordBalanceTransaction(context.state, '', {
    amount: charge.amount,
    currency: charge.currency,
    type: 'charge',
    source: charge.id,
    description: charge.description as string | null,
    availableOn: availableOnAfter(context.settings.balanceAvailableAfterMs),
  }).id;
  Object.assign(paymentIntent, {
    amount_received: paymentIntent.amount,
    last_payment_error: null,
    latest_charge: charge.id,
    next_action: null,
    payment_method: paymentMethod.id,
    status: 'succeeded',
  });
  context.events.emit('charge.succeeded', charge);
  context.events.emit('payment_intent.succeeded', paymentIntent);
  return charge;
}

/** The issuer declines: a failed Charge, the intent back to requires_payment_method with the card error. */
export function declinePayment(
  context: StripeFakeContext,
  paymentIntent: PaymentIntent,
  paymentMethod: PaymentMethod,
  behaviour: Extract<CardBehaviour, { kind: 'decline' }>,
): StripeErrorBody {
  const charge = createCharge(context, paymentIntent, paymentMethod, {
    succeeded: false,
    declineCode: behaviour.declineCode,
    message: behaviour.message,
  });
  const error: StripeErrorBody = {
    type: 'card_error',
    code: 'card_declined',
    decline_code: behaviour.declineCode,
    message: behaviour.message,
    doc_url: docUrl('card_declined'),
    charge: charge.id,
  };
  Object.assign(paymentIntent, {
    last_payment_error: { ...error, payment_method: structuredClone(paymentMethod) },
    latest_charge: charge.id,
    next_action: null,
    payment_method: null,
    status: 'requires_payment_method',
  });
  context.events.emit('charge.failed', charge);
  context.events.emit('payment_intent.payment_failed', paymentIntent);
  return error;
}

/** The card needs the buyer to confirm the payment on `authenticationUrl` before it is charged. */
export function requireAuthentication(
  context: StripeFakeContext,
  paymentIntent: PaymentIntent,
  paymentMethod: PaymentMethod,
  authenticationUrl: string,
): void {
  Object.assign(paymentIntent, {
    last_payment_error: null,
    next_action: { type: 'redirect_to_url', redirect_to_url: { return_url: null, url: authenticationUrl } },
    payment_method: paymentMethod.id,
    status: 'requires_action',
  });
  context.events.emit('payment_intent.requires_action', paymentIntent);
}

/** The buyer failed the confirmation step: no charge, the intent back to requires_payment_method. */
export function failAuthentication(context: StripeFakeContext, paymentIntent: PaymentIntent): StripeErrorBody {
  const paymentMethod = paymentIntent.payment_method
    ? context.state.get<PaymentMethod>('payment_method', paymentIntent.payment_method)
    : undefined;
  const error: StripeErrorBody = {
    type: 'invalid_request_error',
    code: 'payment_intent_authentication_failure',
    message: AUTHENTICATION_FAILED,
    doc_url: docUrl('payment_intent_authentication_failure'),
  };
  Object.assign(paymentIntent, {
    last_payment_error: { ...error, ...(paymentMethod ? { payment_method: structuredClone(paymentMethod) } : {}) },
    next_action: null,
    payment_method: null,
    status: 'requires_payment_method',
  });
  context.events.emit('payment_intent.payment_failed', paymentIntent);
  return error;
}

export function cancelPaymentIntent(context: StripeFakeContext, paymentIntent: PaymentIntent, reason: string): void {
  Object.assign(paymentIntent, {
    canceled_at: unixSeconds(),
    cancellation_reason: reason,
    next_action: null,
    status: 'canceled',
  });
  context.events.emit('payment_intent.canceled', paymentIntent);
}
