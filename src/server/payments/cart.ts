import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '../db/client';
import { cartItems, labs, listings } from '../db/schema';
import { conflict, notFound } from '../http/errors';
import { newId } from '../auth/tokens';
import type { CurrentUser } from '../auth/users';
import { isPublic } from '../listings/service';

export async function addToCart(user: CurrentUser, listingId: string, quantity: number) {
  const db = getDb();
  const [listing] = await db.select().from(listings).where(eq(listings.id, listingId)).limit(1);
  if (!listing || !isPublic(listing)) throw notFound('No such listing.');
  if (user.labs.some((l) => l.id === listing.labId)) throw conflict('This is your own lab’s listing.');
  if (listing.status !== 'live' || listing.quantity < quantity) {
    throw conflict(listing.quantity === 0 ? 'This listing is sold out.' : `Only ${listing.quantity} available.`, {
      quantity: `At most ${listing.quantity}.`,
    });
  }
  await db
    .insert(cartItems)
    .values({ id: newId(), userId: user.id, listingId, quantity })
    .onConflictDoUpdate({ target: [cartItems.userId, cartItems.listingId], set: { quantity } });
  return getCart(user);
}

export async function removeFromCart(user: CurrentUser, itemId: string) {
  const rows = await getDb()
    .delete(cartItems)
    .where(and(eq(cartItems.id, itemId), eq(cartItems.userId, user.id)))
    .returning({ id: cartItems.id });
  if (!rows.length) throw notFound('That item is not in your cart.');
  return getCart(user);
}

/** The cart with what each line costs now (the approved price), grouped by lab, one order per lab at checkout. */
export async function getCart(user: CurrentUser) {
  const rows = await getDb()
    .select({ item: cartItems, listing: listings, labName: labs.name, labCountry: labs.country })
    .from(cartItems)
    .innerJoin(listings, eq(listings.id, cartItems.listingId))
    .innerJoin(labs, eq(labs.id, listings.labId))
    .where(eq(cartItems.userId, user.id))
    .orderBy(asc(cartItems.createdAt));
  const items = rows.map(({ item, listing, labName }) => {
    const p = listing.published;
    return {
      id: item.id,
      listingId: listing.id,
      quantity: item.quantity,
      title: p?.title ?? listing.title,
      unitPriceCents: p?.priceCents ?? listing.priceCents,
      currency: p?.currency ?? listing.currency,
      available: isPublic(listing) && listing.status === 'live' ? listing.quantity : 0,
      shipsTo: p?.shipsTo ?? listing.shipsTo,
      exportControlled: listing.exportControlled,
      lab: { id: listing.labId, name: labName },
    };
  });
  const totals: Record<string, number> = {};
  for (const i of items) totals[i.currency] = (totals[i.currency] ?? 0) + i.unitPriceCents * i.quantity;
  return { items, totals };
}
