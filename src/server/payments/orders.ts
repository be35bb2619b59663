/**
 * The order lifecycle after checkout: paid (webhook), shipped, received, completed with a transfer to
 * the lab, refunds. Every transition is a conditional update (from the states it may leave), audited
 * and mailed to both sides, so a repeated call or a redelivered event changes nothing.
 */
import { and, desc, eq, inArray, lt, sql } from 'drizzle-orm';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { checkouts, labs, orderItems, orders, payoutAccounts, refunds, transfers, users, type Order, type OrderStatus } from '../db/schema';
import { audit } from '../audit/log';
import { kickOutbox, queueMail } from '../email/outbox';
import { conflict, forbidden, HttpError, notFound } from '../http/errors';
import { hasRole } from '../auth/guards';
import type { CurrentUser } from '../auth/users';
import { mailLab } from '../listings/service';
import { getProvider, providerUnavailable } from './provider';
import { recordPayout } from './payouts';
import { formatMoney } from '../../lib/format';

const orderUrl = (id: string) => new URL(`/orders/${id}`, getConfig().APP_ORIGIN).toString();

async function transition(
  order: Order,
  from: OrderStatus[],
  set: Partial<Order>,
  actorId: string | null,
  action: string,
  data?: Record<string, unknown>,
): Promise<Order | null> {
  return getDb().transaction(async (tx) => {
    const rows = await tx
      .update(orders)
      .set({ ...set, version: sql`${orders.version} + 1`, updatedAt: new Date() })
      .where(and(eq(orders.id, order.id), inArray(orders.status, from)))
      .returning();
    if (!rows.length) return null;
    await audit(
      { actorId, action, subjectType: 'order', subjectId: order.id, data: { from: order.status, to: rows[0]!.status, ...data } },
      tx,
    );
    return rows[0]!;
  });
}

async function tell(order: Order, subject: string, line: string) {
  const [buyer] = await getDb().select({ email: users.email }).from(users).where(eq(users.id, order.buyerId));
  const text = `${line}\n\nOrder ${order.id.slice(0, 8)}: ${orderUrl(order.id)}\n`;
  if (buyer) await queueMail({ to: buyer.email, subject, text });
  await mailLab(order.labId, { subject, text });
  kickOutbox();
}

export async function getOrder(id: string): Promise<Order | null> {
  const [o] = await getDb().select().from(orders).where(eq(orders.id, id)).limit(1);
  return o ?? null;
}

/** Buyer, the lab's members, moderators and admins may see an order. */
export async function requireOrderReader(user: CurrentUser, id: string): Promise<{ order: Order; side: 'buyer' | 'lab' | 'staff' }> {
  const order = await getOrder(id);
  if (!order) throw notFound('No such order.');
  if (order.buyerId === user.id) return { order, side: 'buyer' };
  if (user.labs.some((l) => l.id === order.labId)) return { order, side: 'lab' };
  if (hasRole(user, 'moderator', 'admin')) return { order, side: 'staff' };
  throw forbidden('This order is between its buyer and the lab.');
}

export async function orderDetail(order: Order) {
  const db = getDb();
  const [items, [lab], [buyer], refundRows] = await Promise.all([
    db.select().from(orderItems).where(eq(orderItems.orderId, order.id)),
    db.select({ name: labs.name, institute: labs.institute, country: labs.country }).from(labs).where(eq(labs.id, order.labId)),
    db.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, order.buyerId)),
    db.select().from(refunds).where(eq(refunds.orderId, order.id)),
  ]);
  return {
    id: order.id,
    status: order.status,
    currency: order.currency,
    subtotalCents: order.subtotalCents,
    feeCents: order.feeCents,
    feeBps: order.feeBps,
    refundedCents: order.refundedCents,
    carrier: order.carrier,
    trackingNumber: order.trackingNumber,
    paidAt: order.paidAt?.toISOString() ?? null,
    shippedAt: order.shippedAt?.toISOString() ?? null,
    receivedAt: order.receivedAt?.toISOString() ?? null,
    inspectionEndsAt: order.inspectionEndsAt?.toISOString() ?? null,
    completedAt: order.completedAt?.toISOString() ?? null,
    createdAt: order.createdAt.toISOString(),
    refundReason: order.refundReason,
    endUseStatement: order.endUseStatement,
    lab: { id: order.labId, ...lab },
    buyer: buyer ?? null,
    items: items.map((i) => ({ listingId: i.listingId, title: i.title, unitPriceCents: i.unitPriceCents, quantity: i.quantity })),
    refunds: refundRows.map((r) => ({ id: r.id, amountCents: r.amountCents, reason: r.reason, createdAt: r.createdAt.toISOString() })),
  };
}

export async function listOrdersFor(user: CurrentUser, q: { as?: 'buyer' | 'lab'; status?: OrderStatus } = {}) {
  const labIds = user.labs.map((l) => l.id);
  const side = q.as === 'lab' ? (labIds.length ? inArray(orders.labId, labIds) : sql`0`) : eq(orders.buyerId, user.id);
  return getDb()
    .select()
    .from(orders)
    .where(and(side, q.status ? eq(orders.status, q.status) : undefined))
    .orderBy(desc(orders.createdAt))
    .limit(200);
}

/** checkout.session.completed: every order of the checkout is paid. */
export async function markCheckoutPaid(checkoutId: string, paymentIntentId: string | null) {
  const db = getDb();
  const [co] = await db.select().from(checkouts).where(eq(checkouts.id, checkoutId));
  if (!co) return;
  await db
    .update(checkouts)
    .set({ status: 'complete' })
    .where(and(eq(checkouts.id, checkoutId), eq(checkouts.status, 'open')));
  const pending = await db
    .select()
    .from(orders)
    .where(and(eq(orders.checkoutId, checkoutId), eq(orders.status, 'pending_payment')));
  for (const o of pending) {
    const paid = await transition(o, ['pending_payment'], { status: 'paid', paidAt: new Date(), paymentIntentId }, null, 'order.paid');
    if (paid)
      await tell(
        paid,
        'Order paid',
        `The order for ${formatMoney(paid.subtotalCents, paid.currency)} is paid. Lightyard holds the money until the buyer receives the part.`,
      );
  }
}

export async function shipOrder(user: CurrentUser, order: Order, carrier: string, trackingNumber: string) {
  if (!user.labs.some((l) => l.id === order.labId)) throw forbidden('Only the selling lab marks an order shipped.');
  const ends = new Date(Date.now() + getConfig().INSPECTION_DAYS * 86_400_000);
  const shipped = await transition(
    order,
    ['paid'],
    { status: 'shipped', carrier, trackingNumber, shippedAt: new Date(), inspectionEndsAt: ends },
    user.id,
    'order.shipped',
    { carrier, trackingNumber },
  );
  if (!shipped) throw conflict(`Only a paid order can be shipped; this one is ${order.status.replace('_', ' ')}.`);
  await tell(
    shipped,
    'Order shipped',
    `Shipped with ${carrier}, tracking number ${trackingNumber}. The buyer has until ${ends.toISOString().slice(0, 10)} to inspect the part.`,
  );
  return shipped;
}

/** The buyer accepts the part: received, then completed with the lab's transfer. */
export async function confirmReceipt(user: CurrentUser | null, order: Order) {
  if (user && order.buyerId !== user.id) throw forbidden('Only the buyer confirms receipt.');
  const received = await transition(
    order,
    ['shipped'],
    { status: 'received', receivedAt: new Date() },
    user?.id ?? null,
    user ? 'order.received' : 'order.received_automatically',
  );
  if (!received) throw conflict(`Only a shipped order can be confirmed; this one is ${order.status.replace('_', ' ')}.`);
  await tell(
    received,
    'Order received',
    user ? 'The buyer confirmed receipt.' : 'The inspection window ended without a complaint; the order counts as received.',
  );
  return completeOrder(received);
}

/** Transfers the price minus the platform fee (and minus refunds) to the lab's connected account, once. */
export async function completeOrder(order: Order): Promise<Order> {
  if (order.status !== 'received') return order;
  const [account] = await getDb().select().from(payoutAccounts).where(eq(payoutAccounts.labId, order.labId));
  if (!account?.payoutsEnabled) return order;
  const gross = order.subtotalCents - order.refundedCents;
  const net = gross - Math.round((gross * order.feeBps) / 10_000);
  let transferId: string | null = null;
  if (net > 0) {
    try {
      const t = await getProvider().transfers.create(
        {
          amount: net,
          currency: order.currency.toLowerCase(),
          destination: account.providerAccountId,
          transfer_group: order.checkoutId,
          metadata: { orderId: order.id },
        },
        { idempotencyKey: `transfer-${order.id}` },
      );
      transferId = t.id;
      await getDb()
        .insert(transfers)
        .values({ id: t.id, orderId: order.id, labId: order.labId, amountCents: net, currency: order.currency })
        .onConflictDoNothing();
    } catch (err) {
      throw providerUnavailable(err) ?? err;
    }
  }
  const done = await transition(
    order,
    ['received'],
    { status: 'completed', completedAt: new Date(), transferId },
    null,
    'order.completed',
    { transferId, netCents: net },
  );
  if (!done) return order;
  await tell(
    done,
    'Order completed',
    `${formatMoney(net, done.currency)} (the price minus the ${done.feeBps / 100} % platform fee${done.refundedCents ? ' and refunds' : ''}) is on its way to the lab.`,
  );
  if (net > 0) await payOut(order.labId, account.providerAccountId, net, order.currency);
  return done;
}

/** Each transfer is paid out to the lab's bank at once (the provider reports paid or failed later). */
async function payOut(labId: string, accountId: string, amountCents: number, currency: string) {
  const p = await getProvider().payouts.create({ amount: amountCents, currency: currency.toLowerCase() }, { stripeAccount: accountId });
  await recordPayout(labId, p);
}

export async function requestRefund(user: CurrentUser, order: Order, reason: string) {
  if (order.buyerId !== user.id) throw forbidden('Only the buyer asks for a refund.');
  if (order.inspectionEndsAt && order.inspectionEndsAt.getTime() < Date.now())
    throw conflict('The inspection window of this order has ended.');
  const r = await transition(
    order,
    ['paid', 'shipped'],
    { status: 'refund_requested', refundReason: reason },
    user.id,
    'order.refund_requested',
    { reason },
  );
  if (!r) throw conflict(`A refund can be requested for a paid or shipped order; this one is ${order.status.replace('_', ' ')}.`);
  await tell(r, 'Refund requested', `The buyer asks for a refund: ${reason}\n\nA moderator decides.`);
  return r;
}

/** A moderator or admin refunds all or part of the payment through the provider. */
export async function refundOrder(staff: CurrentUser, order: Order, amountCents: number | undefined, reason: string) {
  if (!['paid', 'shipped', 'received', 'refund_requested'].includes(order.status))
    throw conflict(`This order is ${order.status.replace('_', ' ')}; it cannot be refunded.`);
  if (!order.paymentIntentId) throw conflict('This order has no payment to refund.');
  const remaining = order.subtotalCents - order.refundedCents;
  const amount = amountCents ?? remaining;
  if (amount > remaining)
    throw new HttpError(400, 'validation_failed', `At most ${formatMoney(remaining, order.currency)} is left to refund.`, {
      amountCents: 'Too much.',
    });
  let refund;
  try {
    refund = await getProvider().refunds.create(
      { payment_intent: order.paymentIntentId, amount, reason: 'requested_by_customer', metadata: { orderId: order.id } },
      { idempotencyKey: `refund-${order.id}-${order.refundedCents}-${amount}` },
    );
  } catch (err) {
    throw providerUnavailable(err) ?? err;
  }
  const full = amount === remaining;
  const resumed: OrderStatus = order.shippedAt ? 'shipped' : 'paid';
  const updated = await getDb().transaction(async (tx) => {
    await tx
      .insert(refunds)
      .values({ id: refund.id, orderId: order.id, amountCents: amount, reason, createdBy: staff.id })
      .onConflictDoNothing();
    const rows = await tx
      .update(orders)
      .set({
        refundedCents: sql`${orders.refundedCents} + ${amount}`,
        status: full ? 'refunded' : order.status === 'refund_requested' ? resumed : order.status,
        version: sql`${orders.version} + 1`,
        updatedAt: new Date(),
      })
      .where(and(eq(orders.id, order.id), eq(orders.refundedCents, order.refundedCents)))
      .returning();
    if (!rows.length) throw conflict('This order changed meanwhile; reload it.');
    await audit(
      {
        actorId: staff.id,
        action: full ? 'order.refunded' : 'order.partially_refunded',
        subjectType: 'order',
        subjectId: order.id,
        data: { amount, reason, refundId: refund.id },
      },
      tx,
    );
    return rows[0]!;
  });
  await tell(
    updated,
    full ? 'Order refunded' : 'Order partly refunded',
    `${formatMoney(amount, order.currency)} was refunded to the buyer: ${reason}`,
  );
  return updated;
}

/** Orders whose inspection window ended without the buyer's word count as received. */
export async function receiveOverdue(now = Date.now()) {
  const due = await getDb()
    .select()
    .from(orders)
    .where(and(eq(orders.status, 'shipped'), lt(orders.inspectionEndsAt, new Date(now))));
  for (const o of due) await confirmReceipt(null, o);
  const waiting = await getDb().select().from(orders).where(eq(orders.status, 'received'));
  for (const o of waiting) await completeOrder(o);
  return due.length;
}
