import { eq } from 'drizzle-orm';
import { getDb } from '../db/client';
import { listings, type Listing } from '../db/schema';
import { hasRole, requireLabMember, requireVerifiedUser } from '../auth/guards';
import { notFound } from '../http/errors';
import type { CurrentUser } from '../auth/users';

type WithLocals = { locals: App.Locals };

export async function getListing(id: string): Promise<Listing | null> {
  const [row] = await getDb().select().from(listings).where(eq(listings.id, id)).limit(1);
  return row ?? null;
}

/** Who may see a listing that is not public: its lab's members, moderators and admins. */
export function canSeeUnpublished(user: CurrentUser | null, listing: Pick<Listing, 'labId'>): boolean {
  return !!user && (user.labs.some((l) => l.id === listing.labId) || hasRole(user, 'moderator', 'admin'));
}

/** A verified member of the listing's lab (any member may edit the lab's listings). 404 when it does not exist. */
export async function requireListingEditor(ctx: WithLocals, listingId: string): Promise<{ user: CurrentUser; listing: Listing }> {
  requireVerifiedUser(ctx);
  const listing = await getListing(listingId);
  if (!listing) throw notFound('No such listing.');
  const { user } = await requireLabMember(ctx, listing.labId);
  return { user, listing };
}
