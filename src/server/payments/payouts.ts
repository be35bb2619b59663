import { asc, desc, eq, sql } from 'drizzle-orm';
import type Stripe from 'stripe';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { labs, orders, payoutAccounts, payouts, transfers, users, PAYOUT_STATUSES } from '../db/schema';
import { audit } from '../audit/log';
import type { CurrentUser } from '../auth/users';
import { getProvider, providerUnavailable } from './provider';

type PayoutStatus = (typeof PAYOUT_STATUSES)[number];

/** The lab's connected account (created on first use) and a one-time onboarding link on the provider. */
export async function onboardingLink(owner: CurrentUser, labId: string): Promise<{ url: string }> {
  const db = getDb();
  const c = getConfig();
  try {
    let [account] = await db.select().from(payoutAccounts).where(eq(payoutAccounts.labId, labId));
    if (!account) {
      const [lab] = await db.select().from(labs).where(eq(labs.id, labId));
      const created = await getProvider().accounts.create(
        {
          type: 'express',
          country: lab!.country,
          email: owner.email,
          metadata: { labId },
          capabilities: { transfers: { requested: true } },
        },
        { idempotencyKey: `account-${labId}` },
      );
      await db.insert(payoutAccounts).values({ labId, providerAccountId: created.id }).onConflictDoNothing();
      await audit({
        actorId: owner.id,
        action: 'payouts.account_created',
        subjectType: 'lab',
        subjectId: labId,
        data: { account: created.id },
      });
      [account] = await db.select().from(payoutAccounts).where(eq(payoutAccounts.labId, labId));
    }
    const link = await getProvider().accountLinks.create({
      account: account!.providerAccountId,
      type: 'account_onboarding',
      refresh_url: `${c.APP_ORIGIN}/payouts?onboarding=retry`,
      return_url: `${c.APP_ORIGIN}/payouts?onboarding=done`,
    });
    return { url: link.url };
  } catch (err) {
    throw providerUnavailable(err) ?? err;
  }
}

/** account.updated: what the provider now allows for the lab's account. */
export async function syncAccount(account: Stripe.Account) {
  await getDb()
    .update(payoutAccounts)
    .set({
      detailsSubmitted: !!account.details_submitted,
      chargesEnabled: !!account.charges_enabled,
      payoutsEnabled: !!account.payouts_enabled,
      updatedAt: new Date(),
    })
    .where(eq(payoutAccounts.providerAccountId, account.id));
}

export async function labOfAccount(accountId: string): Promise<string | null> {
  const [row] = await getDb()
    .select({ labId: payoutAccounts.labId })
    .from(payoutAccounts)
    .where(eq(payoutAccounts.providerAccountId, accountId));
  return row?.labId ?? null;
}

export async function recordPayout(labId: string, p: Stripe.Payout) {
  const status = (PAYOUT_STATUSES as readonly string[]).includes(p.status) ? (p.status as PayoutStatus) : 'pending';
  await getDb()
    .insert(payouts)
    .values({
      id: p.id,
      labId,
      amountCents: p.amount,
      currency: p.currency.toUpperCase(),
      status,
      failureMessage: p.failure_message ?? null,
    })
    .onConflictDoUpdate({ target: payouts.id, set: { status, failureMessage: p.failure_message ?? null, updatedAt: new Date() } });
}

/** What the payouts page shows: balance from the provider, transfers per order, payouts, monthly earnings. */
export async function payoutsView(labId: string) {
  const db = getDb();
  const [account] = await db.select().from(payoutAccounts).where(eq(payoutAccounts.labId, labId));
  const transferRows = await db
    .select({
      id: transfers.id,
      orderId: transfers.orderId,
      amountCents: transfers.amountCents,
      currency: transfers.currency,
      createdAt: transfers.createdAt,
      subtotalCents: orders.subtotalCents,
      feeCents: orders.feeCents,
      buyer: users.name,
    })
    .from(transfers)
    .innerJoin(orders, eq(orders.id, transfers.orderId))
    .innerJoin(users, eq(users.id, orders.buyerId))
    .where(eq(transfers.labId, labId))
    .orderBy(desc(transfers.createdAt));
  const payoutRows = await db.select().from(payouts).where(eq(payouts.labId, labId)).orderBy(desc(payouts.createdAt));
  const monthly = await db
    .select({
      month: sql<string>`strftime('%Y-%m', ${transfers.createdAt} / 1000, 'unixepoch')`,
      currency: transfers.currency,
      cents: sql<number>`sum(${transfers.amountCents})`,
    })
    .from(transfers)
    .where(eq(transfers.labId, labId))
    .groupBy(sql`1, 2`)
    .orderBy(asc(sql`1`));
  let balance: { available: { amount: number; currency: string }[]; pending: { amount: number; currency: string }[] } | null = null;
  let balanceError: string | null = null;
  if (account) {
    try {
      const b = await getProvider().balance.retrieve({}, { stripeAccount: account.providerAccountId });
      balance = {
        available: b.available.map((x) => ({ amount: x.amount, currency: x.currency.toUpperCase() })),
        pending: b.pending.map((x) => ({ amount: x.amount, currency: x.currency.toUpperCase() })),
      };
    } catch {
      balanceError = 'The payment provider is not answering; the balance shows again when it is back.';
    }
  }
  const heldCents = await db
    .select({ currency: orders.currency, cents: sql<number>`sum(${orders.subtotalCents} - ${orders.refundedCents} - ${orders.feeCents})` })
    .from(orders)
    .where(sql`${orders.labId} = ${labId} and ${orders.status} in ('paid', 'shipped', 'received', 'refund_requested')`)
    .groupBy(orders.currency);
  return {
    account: account
      ? {
          id: account.providerAccountId,
          detailsSubmitted: account.detailsSubmitted,
          chargesEnabled: account.chargesEnabled,
          payoutsEnabled: account.payoutsEnabled,
        }
      : null,
    balance,
    balanceError,
    held: heldCents.map((h) => ({ currency: h.currency, amount: h.cents })),
    transfers: transferRows.map((t) => ({ ...t, createdAt: t.createdAt.toISOString() })),
    payouts: payoutRows.map((p) => ({
      id: p.id,
      amountCents: p.amountCents,
      currency: p.currency,
      status: p.status,
      failureMessage: p.failureMessage,
      createdAt: p.createdAt.toISOString(),
      updatedAt: p.updatedAt.toISOString(),
    })),
    monthly,
  };
}
