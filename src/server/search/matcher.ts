/**
 * Saved searches against listings that just became searchable or were approved again: every active
 * saved search created before the approval is run against the listing; a fit (verdict "fits") is
 * recorded once per search and listing, and the buyer gets at most one e-mail per saved search per
 * day. Several app instances may run this for the same listing: the hit's primary key and the
 * conditional update of last_notified_at decide, inside one transaction, who records and who mails.
 */
import { and, eq, isNull, lt, lte, ne, or } from 'drizzle-orm';
import { FitInputError } from '../../lib/fit';
import type { Category } from '../../lib/listings/constants';
import type { GoalMode } from '../../lib/schemas/search';
import { newToken } from '../auth/tokens';
import { getDb } from '../db/client';
import { savedSearches, savedSearchHits, users } from '../db/schema';
import { kickOutbox, queueMail } from '../email/outbox';
import type { Catalogue } from './catalogue';
import type { SearchDoc } from './documents';
import { savedSearchMail } from './mail';
import { storedQuery } from './saved-searches';
import { fitOfListing, matchesText, type ListingFit } from './search';

export const MAIL_INTERVAL_MS = 24 * 3600_000;

const MODE_CATEGORIES: Record<GoalMode, readonly Category[]> = {
  cavity: ['cavity-mirror'],
  squeezing: ['photodiode', 'balanced-detector'],
  counting: ['single-photon-detector'],
  laser: ['laser'],
};

type SavedSearch = typeof savedSearches.$inferSelect;

function match(cat: Catalogue, s: SavedSearch, doc: SearchDoc): { fit: ListingFit | null } | null {
  const { search } = storedQuery(s);
  if (search.mode === 'text') return matchesText(cat, search.q, search.filters, doc.id) ? { fit: null } : null;
  if (!MODE_CATEGORIES[search.mode].includes(doc.category)) return null;
  try {
    const fit = fitOfListing(cat, search, doc.id);
    return fit === null ? null : { fit };
  } catch (e) {
    // a goal saved earlier that the fit engine refuses now matches nothing
    if (e instanceof FitInputError) return null;
    throw e;
  }
}

export async function matchApprovedListings(cat: Catalogue, listingIds: string[]): Promise<void> {
  const db = getDb();
  for (const id of listingIds) {
    const doc = cat.get(id);
    if (!doc) continue;
    const candidates = await db
      .select()
      .from(savedSearches)
      .where(and(eq(savedSearches.active, true), lt(savedSearches.createdAt, new Date(doc.approvedAt))));
    for (const s of candidates) {
      const m = match(cat, s, doc);
      if (m) await recordHit(cat, s, doc, m.fit);
    }
  }
}

async function recordHit(cat: Catalogue, s: SavedSearch, doc: SearchDoc, fit: ListingFit | null): Promise<void> {
  const now = new Date();
  const token = newToken();
  const mailed = await getDb().transaction(async (tx) => {
    const [hit] = await tx.insert(savedSearchHits).values({ savedSearchId: s.id, listingId: doc.id }).onConflictDoNothing().returning();
    if (!hit) return false;
    const [open] = await tx
      .update(savedSearches)
      .set({ lastNotifiedAt: now, unsubscribeTokenHash: token.hash })
      .where(
        and(
          eq(savedSearches.id, s.id),
          eq(savedSearches.active, true),
          or(isNull(savedSearches.lastNotifiedAt), lte(savedSearches.lastNotifiedAt, new Date(now.getTime() - MAIL_INTERVAL_MS))),
        ),
      )
      .returning({ id: savedSearches.id });
    if (!open) return false;
    const [buyer] = await tx.select({ email: users.email, name: users.name }).from(users).where(eq(users.id, s.userId));
    if (!buyer) return false;
    const earlier = await tx
      .select({ listingId: savedSearchHits.listingId })
      .from(savedSearchHits)
      .where(and(eq(savedSearchHits.savedSearchId, s.id), isNull(savedSearchHits.notifiedAt), ne(savedSearchHits.listingId, doc.id)));
    const others = earlier.map((h) => cat.get(h.listingId)).filter((d): d is SearchDoc => d !== undefined);
    await queueMail(
      savedSearchMail({
        to: buyer.email,
        buyerName: buyer.name,
        searchName: s.name,
        url: storedQuery(s).url,
        doc,
        fit,
        others,
        token: token.token,
      }),
      tx,
    );
    await tx
      .update(savedSearchHits)
      .set({ notifiedAt: now })
      .where(and(eq(savedSearchHits.savedSearchId, s.id), isNull(savedSearchHits.notifiedAt)));
    return true;
  });
  if (mailed) kickOutbox();
}
