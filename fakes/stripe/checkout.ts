import { checkCard, type CardEntry, type CheckedCard } from './cards';
import type { StripeFakeContext } from './context';
import { invalidRequest, StripeFakeError, type StripeErrorBody } from './errors';
import type { EventRequest } from './events';
import type { ListObject } from './list';
import {
  cancelPaymentIntent,
  createCardPaymentMethod,
  createPaymentIntent,
  declinePayment,
  failAuthentication,
  requireAuthentication,
  succeedPayment,
  type Billing,
  type PaymentIntent,
  type PaymentMethod,
} from './payments';
import type { ScheduledJob, StateStore, StripeObject } from './state';

export interface CheckoutSession extends StripeObject {
  object: 'checkout.session';
  amount_total: number;
  cancel_url: string | null;
  currency: string;
  customer_email: string | null;
  expires_at: number;
  metadata: Record<string, string>;
  payment_intent: string | null;
  payment_status: 'paid' | 'unpaid';
  status: 'open' | 'complete' | 'expired';
  success_url: string | null;
  url: string | null;
}

export type PaymentAttempt =
  | { outcome: 'succeeded'; session: CheckoutSession }
  | { outcome: 'requires_action'; session: CheckoutSession }
  | { outcome: 'failed'; session: CheckoutSession; error: StripeErrorBody };

export function payPagePath(sessionId: string): string {
  return `/pay/${encodeURIComponent(sessionId)}`;
}

export function authenticationPagePath(sessionId: string): string {
  return `${payPagePath(sessionId)}/authenticate`;
}

export function lineItemsOf(state: StateStore, sessionId: string): StripeObject[] {
  return state.checkoutSessions[sessionId]?.lineItems ?? [];
}

/** The session's `line_items`, which the provider returns only when expanded. */
export function lineItemsList(session: Record<string, unknown>, state: StateStore): ListObject<StripeObject> {
  const id = String(session.id);
  return { object: 'list', data: lineItemsOf(state, id), has_more: false, url: `/v1/checkout/sessions/${id}/line_items` };
}

/** Where the buyer goes after paying: success_url with `{CHECKOUT_SESSION_ID}` filled in. */
export function successRedirect(session: CheckoutSession): string | null {
  return session.success_url?.replaceAll('{CHECKOUT_SESSION_ID}', session.id) ?? null;
}

export function expireCheckoutSession(context: StripeFakeContext, session: CheckoutSession, request: EventRequest | null): void {
  const paymentIntent = session.payment_intent ? context.state.get<PaymentIntent>('payment_intent', session.payment_intent) : undefined;
  Object.assign(session, { status: 'expired', url: null });
  context.scheduler.cancel('expire_checkout_session', session.id, '');
  if (paymentIntent && paymentIntent.status !== 'succeeded' && paymentIntent.status !== 'canceled') {
    cancelPaymentIntent(context, paymentIntent, 'abandoned');
  }
  context.events.emit('checkout.session.expired', session, { request });
}

/** The timer set at creation: a session still open at `expires_at` expires. */
export function expireDueSession(context: StripeFakeContext, job: ScheduledJob): void {
  const session = context.state.get<CheckoutSession>('checkout.session', job.objectId);
  if (session?.status === 'open') expireCheckoutSession(context, session, null);
}

/** Expires a session whose `expires_at` has passed, in case its timer has not fired yet. */
export function expireIfDue(context: StripeFakeContext, session: CheckoutSession): void {
  if (session.status === 'open' && Date.now() >= session.expires_at * 1000) expireCheckoutSession(context, session, null);
}

/** Refuses payment for a session that is not open: 410 once expired, 409 once paid. */
function requireOpen(context: StripeFakeContext, session: CheckoutSession): void {
  expireIfDue(context, session);
  if (session.status === 'expired') {
    throw invalidRequest('This Checkout Session has expired and can no longer be paid.', { status: 410 });
  }
  if (session.status === 'complete') throw invalidRequest('This Checkout Session has already been paid.', { status: 409 });
}

function completeSession(context: StripeFakeContext, session: CheckoutSession, billing: Billing): void {
  Object.assign(session, {
    customer_details: {
      address: null,
      business_name: null,
      email: session.customer_email ?? billing.email,
      individual_name: null,
      name: billing.name,
      phone: null,
      tax_exempt: 'none',
      tax_ids: [],
    },
    payment_status: 'paid',
    status: 'complete',
    url: null,
  });
  context.scheduler.cancel('expire_checkout_session', session.id, '');
  context.events.emit('checkout.session.completed', session);
}

function paymentIntentFor(context: StripeFakeContext, session: CheckoutSession): PaymentIntent {
  const existing = session.payment_intent ? context.state.get<PaymentIntent>('payment_intent', session.payment_intent) : undefined;
  if (existing) return existing;
  const data = context.state.checkoutSessions[session.id]?.paymentIntentData;
  const paymentIntent = createPaymentIntent(context, {
    amount: session.amount_total,
    currency: session.currency,
    metadata: data?.metadata ?? {},
    transferGroup: data?.transferGroup ?? null,
    description: data?.description ?? null,
  });
  session.payment_intent = paymentIntent.id;
  return paymentIntent;
}

/**
 * One payment attempt with a card, as the hosted page submits it. The card's checks come first
 * and leave nothing behind; then the test card decides: paid, declined, or waiting for the
 * confirmation step on the authentication page.
 */
export function payCheckoutSession(
  context: StripeFakeContext,
  session: CheckoutSession,
  entry: CardEntry & Partial<Billing>,
): PaymentAttempt {
  requireOpen(context, session);
  let card: CheckedCard;
  try {
    card = checkCard(entry);
  } catch (error) {
    if (error instanceof StripeFakeError && error.status === 402) return { outcome: 'failed', session, error: error.body };
    throw error;
  }
  const billing: Billing = { name: entry.name ?? null, email: entry.email ?? session.customer_email };
  const paymentIntent = paymentIntentFor(context, session);
  const paymentMethod = createCardPaymentMethod(context, card, billing);
  switch (card.behaviour.kind) {
    case 'succeed':
      succeedPayment(context, paymentIntent, paymentMethod, { authenticated: false });
      completeSession(context, session, billing);
      return { outcome: 'succeeded', session };
    case 'decline':
      return { outcome: 'failed', session, error: declinePayment(context, paymentIntent, paymentMethod, card.behaviour) };
    case 'authenticate':
      requireAuthentication(context, paymentIntent, paymentMethod, `${context.settings.publicUrl}${authenticationPagePath(session.id)}`);
      return { outcome: 'requires_action', session };
  }
}

/** The payment waiting for authentication, if the session has one. */
export function pendingAuthentication(context: StripeFakeContext, session: CheckoutSession): PaymentIntent | undefined {
  if (!session.payment_intent) return undefined;
  const paymentIntent = context.state.get<PaymentIntent>('payment_intent', session.payment_intent);
  return paymentIntent?.status === 'requires_action' ? paymentIntent : undefined;
}

/** The buyer's answer on the authentication page: the payment goes through, or fails. */
export function finishAuthentication(context: StripeFakeContext, session: CheckoutSession, authenticated: boolean): PaymentAttempt {
  requireOpen(context, session);
  const paymentIntent = pendingAuthentication(context, session);
  if (!paymentIntent) throw invalidRequest('This Checkout Session has no payment waiting for authentication.', { status: 409 });
  if (!authenticated) return { outcome: 'failed', session, error: failAuthentication(context, paymentIntent) };
  const paymentMethod = context.state.get<PaymentMethod>('payment_method', paymentIntent.payment_method ?? '');
  if (!paymentMethod) throw new Error(`payment intent ${paymentIntent.id} waits for authentication without a payment method`);
  const billing = paymentMethod.billing_details as Billing;
  succeedPayment(context, paymentIntent, paymentMethod, { authenticated: true });
  completeSession(context, session, billing);
  return { outcome: 'succeeded', session };
}
