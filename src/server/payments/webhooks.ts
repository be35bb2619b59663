/**
 * Provider events, verified on the raw body and handled once per event id: the id is recorded after
 * the first successful handling (each handler is itself idempotent, so a crash in between is safe),
 * and a redelivery is acknowledged unchanged.
 */
import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { checkouts, providerEvents } from '../db/schema';
import { audit } from '../audit/log';
import { HttpError } from '../http/errors';
import { getProvider } from './provider';
import { overdueCheckouts, releaseReservation } from './checkout';
import { markCheckoutPaid } from './orders';
import { labOfAccount, recordPayout, syncAccount } from './payouts';

export function verifyEvent(rawBody: string, signature: string | null): Stripe.Event {
  if (!signature) throw new HttpError(400, 'bad_signature', 'Missing provider signature.');
  try {
    return getProvider().webhooks.constructEvent(rawBody, signature, getConfig().STRIPE_WEBHOOK_SECRET);
  } catch {
    throw new HttpError(400, 'bad_signature', 'The provider signature does not match.');
  }
}

async function checkoutIdOf(session: Stripe.Checkout.Session): Promise<string | null> {
  const fromMeta = session.metadata?.checkoutId ?? session.client_reference_id;
  if (fromMeta) return fromMeta;
  const [row] = await getDb().select({ id: checkouts.id }).from(checkouts).where(eq(checkouts.providerSessionId, session.id));
  return row?.id ?? null;
}

async function handle(event: Stripe.Event): Promise<void> {
  switch (event.type) {
    case 'checkout.session.completed': {
      const s = event.data.object;
      const id = await checkoutIdOf(s);
      if (id && s.payment_status === 'paid')
        await markCheckoutPaid(id, typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null));
      return;
    }
    case 'checkout.session.expired': {
      const id = await checkoutIdOf(event.data.object);
      if (id) await releaseReservation(id, 'expired');
      return;
    }
    case 'payment_intent.payment_failed': {
      const pi = event.data.object;
      const checkoutId = pi.metadata?.checkoutId;
      if (checkoutId)
        await audit({
          actorId: null,
          action: 'checkout.payment_failed',
          subjectType: 'checkout',
          subjectId: checkoutId,
          data: { message: pi.last_payment_error?.message ?? null },
        });
      return;
    }
    case 'charge.refunded': {
      const ch = event.data.object;
      const pi = typeof ch.payment_intent === 'string' ? ch.payment_intent : ch.payment_intent?.id;
      if (pi)
        await audit({
          actorId: null,
          action: 'provider.charge_refunded',
          subjectType: 'payment_intent',
          subjectId: pi,
          data: { amountRefunded: ch.amount_refunded },
        });
      return;
    }
    case 'account.updated':
      await syncAccount(event.data.object);
      return;
    case 'transfer.created': {
      const t = event.data.object;
      const orderId = t.metadata?.orderId;
      if (orderId)
        await audit({
          actorId: null,
          action: 'provider.transfer_created',
          subjectType: 'order',
          subjectId: orderId,
          data: { transfer: t.id, amount: t.amount },
        });
      return;
    }
    case 'payout.paid':
    case 'payout.failed': {
      const labId = event.account ? await labOfAccount(event.account) : null;
      if (labId) await recordPayout(labId, event.data.object);
      return;
    }
    default:
      return;
  }
}

/** Handles the event unless its id was seen; returns whether this delivery changed anything. */
export async function processEvent(event: Stripe.Event): Promise<boolean> {
  const db = getDb();
  const [seen] = await db.select({ id: providerEvents.id }).from(providerEvents).where(eq(providerEvents.id, event.id));
  if (seen) return false;
  await handle(event);
  const inserted = await db
    .insert(providerEvents)
    .values({ id: event.id, type: event.type })
    .onConflictDoNothing()
    .returning({ id: providerEvents.id });
  return inserted.length === 1;
}

/** Asks the provider about open checkouts past their hold: paid ones are marked paid (a missed webhook), the rest expire and give the stock back. */
export async function reconcileCheckouts(now = Date.now()): Promise<{ paid: number; released: number }> {
  let paid = 0;
  let released = 0;
  for (const co of await overdueCheckouts(now)) {
    if (co.providerSessionId) {
      const s = await getProvider().checkout.sessions.retrieve(co.providerSessionId);
      if (s.status === 'complete' && s.payment_status === 'paid') {
        await markCheckoutPaid(co.id, typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null));
        paid++;
        continue;
      }
      if (s.status === 'open') await getProvider().checkout.sessions.expire(s.id);
    }
    if (await releaseReservation(co.id, 'expired')) released++;
  }
  return { paid, released };
}
