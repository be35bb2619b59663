/**
 * Checkout: reserve the stock, write one order per lab and one provider Checkout Session for them all.
 * The reservation is one transaction with conditional decrements, so stock never goes below zero and
 * two buyers can never both take the last unit; a provider failure undoes the reservation.
 */
import { and, eq, inArray, isNull, lt, sql } from 'drizzle-orm';
import type { Region } from '../../lib/listings/constants';
import { regionOfCountry, shipsTo } from '../../lib/regions';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { cartItems, checkouts, labs, listings, orderItems, orders, type Checkout } from '../db/schema';
import { audit } from '../audit/log';
import { conflict, HttpError } from '../http/errors';
import { newId } from '../auth/tokens';
import type { CurrentUser } from '../auth/users';
import { notifyListingChanged } from '../listings/events';
import { getCart } from './cart';
import { getProvider, providerUnavailable } from './provider';

class SoldOut extends Error {}

function destinationOf(user: CurrentUser, shipTo: Region | undefined, labCountry: string | undefined): Region | null {
  if (shipTo) return shipTo;
  return labCountry ? regionOfCountry(labCountry) : null;
}

export async function startCheckout(user: CurrentUser, input: { shipTo?: Region; endUse?: Record<string, string> }) {
  const cart = await getCart(user);
  if (!cart.items.length) throw new HttpError(400, 'validation_failed', 'Your cart is empty.');
  const currencies = Object.keys(cart.totals);
  if (currencies.length > 1)
    throw conflict(`Your cart mixes ${currencies.join(' and ')}. Check out one currency at a time: remove the other items first.`);
  const currency = currencies[0]!;
  const [buyerLab] = user.labs.length
    ? await getDb().select({ country: labs.country }).from(labs).where(eq(labs.id, user.labs[0]!.id))
    : [];
  const destination = destinationOf(user, input.shipTo, buyerLab?.country);
  const fields: Record<string, string> = {};
  for (const i of cart.items) {
    if (!shipsTo(i.shipsTo, destination))
      fields[`items.${i.listingId}`] = `“${i.title}” does not ship to ${destination ?? 'your region'} (ships to ${i.shipsTo.join(', ')}).`;
    if (i.exportControlled && !input.endUse?.[i.listingId])
      fields[`endUse.${i.listingId}`] = `“${i.title}” is export-controlled: state its end use first.`;
  }
  if (!destination && !Object.keys(fields).length && cart.items.some((i) => !i.shipsTo.includes('WORLD'))) {
    throw new HttpError(400, 'validation_failed', 'Say where the parts should go.', { shipTo: 'Choose a region.' });
  }
  if (Object.keys(fields).length) throw new HttpError(422, 'unprocessable', Object.values(fields)[0]!, fields);

  const c = getConfig();
  const checkoutId = newId();
  const reservedUntil = new Date(Date.now() + c.RESERVATION_SECONDS * 1000);
  const byLab = new Map<string, typeof cart.items>();
  for (const i of cart.items) byLab.set(i.lab.id, [...(byLab.get(i.lab.id) ?? []), i]);
  const orderIds: string[] = [];
  const touched: string[] = [];
  try {
    await getDb().transaction(async (tx) => {
      for (const i of cart.items) {
        const took = await tx
          .update(listings)
          .set({
            quantity: sql`${listings.quantity} - ${i.quantity}`,
            status: sql`case when ${listings.quantity} - ${i.quantity} = 0 then 'sold-out' else ${listings.status} end`,
            version: sql`${listings.version} + 1`,
            updatedAt: new Date(),
          })
          .where(and(eq(listings.id, i.listingId), eq(listings.status, 'live'), sql`${listings.quantity} >= ${i.quantity}`))
          .returning({ id: listings.id });
        if (!took.length) throw new SoldOut(i.title);
        touched.push(i.listingId);
      }
      const amount = cart.totals[currency]!;
      await tx.insert(checkouts).values({ id: checkoutId, buyerId: user.id, currency, amountCents: amount, reservedUntil });
      for (const [labId, items] of byLab) {
        const orderId = newId();
        orderIds.push(orderId);
        const subtotal = items.reduce((s, i) => s + i.unitPriceCents * i.quantity, 0);
        const endUse =
          items
            .map((i) => (i.exportControlled ? `${i.title}: ${input.endUse![i.listingId]}` : null))
            .filter(Boolean)
            .join('\n') || null;
        await tx.insert(orders).values({
          id: orderId,
          checkoutId,
          buyerId: user.id,
          labId,
          currency,
          subtotalCents: subtotal,
          feeBps: c.PLATFORM_FEE_BPS,
          feeCents: Math.round((subtotal * c.PLATFORM_FEE_BPS) / 10_000),
          endUseStatement: endUse,
        });
        await tx.insert(orderItems).values(
          items.map((i) => ({
            id: newId(),
            orderId,
            listingId: i.listingId,
            title: i.title,
            unitPriceCents: i.unitPriceCents,
            quantity: i.quantity,
          })),
        );
        await audit(
          { actorId: user.id, action: 'order.created', subjectType: 'order', subjectId: orderId, data: { checkoutId, subtotal, currency } },
          tx,
        );
      }
    });
  } catch (e) {
    if (e instanceof SoldOut) throw conflict(`“${e.message}” just sold out. Take it out of your cart to check out the rest.`);
    throw e;
  }
  for (const id of touched) notifyListingChanged(id);

  let session;
  try {
    session = await getProvider().checkout.sessions.create(
      {
        mode: 'payment',
        line_items: cart.items.map((i) => ({
          price_data: { currency: currency.toLowerCase(), unit_amount: i.unitPriceCents, product_data: { name: i.title } },
          quantity: i.quantity,
        })),
        success_url: `${c.APP_ORIGIN}/orders/paid?session_id={CHECKOUT_SESSION_ID}`,
        cancel_url: `${c.APP_ORIGIN}/cart?cancelled=${checkoutId}`,
        client_reference_id: checkoutId,
        customer_email: user.email,
        metadata: { checkoutId },
        // the provider wants at least 30 minutes; the reservation job expires it on time when ours is shorter
        expires_at: Math.floor(Math.max(reservedUntil.getTime(), Date.now() + 1860_000) / 1000),
        payment_intent_data: { metadata: { checkoutId }, transfer_group: checkoutId },
      },
      { idempotencyKey: `checkout-${checkoutId}` },
    );
  } catch (err) {
    await releaseReservation(checkoutId, 'failed');
    throw providerUnavailable(err) ?? err;
  }
  await getDb().transaction(async (tx) => {
    await tx.update(checkouts).set({ providerSessionId: session.id }).where(eq(checkouts.id, checkoutId));
    await tx.delete(cartItems).where(eq(cartItems.userId, user.id));
  });
  return { orderIds, checkoutUrl: session.url!, sessionId: session.id };
}

/**
 * Gives the held stock back and cancels the unpaid orders; a no-op when already released or paid,
 * so the webhook, the reservation job and a failed session create may all call it.
 */
export async function releaseReservation(checkoutId: string, status: 'expired' | 'failed'): Promise<boolean> {
  const released: string[] = [];
  const done = await getDb().transaction(async (tx) => {
    const claimed = await tx
      .update(checkouts)
      .set({ status, releasedAt: new Date() })
      .where(and(eq(checkouts.id, checkoutId), eq(checkouts.status, 'open'), isNull(checkouts.releasedAt)))
      .returning({ id: checkouts.id });
    if (!claimed.length) return false;
    const pending = await tx
      .select({ id: orders.id })
      .from(orders)
      .where(and(eq(orders.checkoutId, checkoutId), eq(orders.status, 'pending_payment')));
    const ids = pending.map((o) => o.id);
    if (ids.length) {
      const items = await tx.select().from(orderItems).where(inArray(orderItems.orderId, ids));
      for (const i of items) {
        await tx
          .update(listings)
          .set({
            quantity: sql`${listings.quantity} + ${i.quantity}`,
            status: sql`case when ${listings.status} = 'sold-out' then 'live' else ${listings.status} end`,
            version: sql`${listings.version} + 1`,
            updatedAt: new Date(),
          })
          .where(eq(listings.id, i.listingId));
        released.push(i.listingId);
      }
      await tx.update(orders).set({ status: 'cancelled', updatedAt: new Date() }).where(inArray(orders.id, ids));
      for (const id of ids)
        await audit(
          {
            actorId: null,
            action: 'order.cancelled',
            subjectType: 'order',
            subjectId: id,
            data: { reason: status === 'expired' ? 'reservation expired' : 'payment could not start' },
          },
          tx,
        );
    }
    return true;
  });
  for (const id of released) notifyListingChanged(id);
  return done;
}

/** Open checkouts whose hold has run out. */
export async function overdueCheckouts(now = Date.now()): Promise<Checkout[]> {
  return getDb()
    .select()
    .from(checkouts)
    .where(and(eq(checkouts.status, 'open'), lt(checkouts.reservedUntil, new Date(now))));
}
