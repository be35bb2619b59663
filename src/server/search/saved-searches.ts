/**
 * A buyer's saved searches: the request the search page ran, and the page address to open it again.
 * Unsubscribing needs no sign-in: the e-mail carries a token whose SHA-256 is stored. A new token is
 * issued with each e-mail (the plain token is never stored, so it cannot be sent again); the link in
 * the latest e-mail works, and the saved-searches page works for the signed-in buyer.
 */
import { and, desc, eq, sql } from 'drizzle-orm';
import type { GoalSearchRequest, SavedSearchCreate, TextSearchRequest } from '../../lib/schemas/search';
import { hashToken, newId, newToken } from '../auth/tokens';
import type { CurrentUser } from '../auth/users';
import { getDb } from '../db/client';
import { savedSearches, savedSearchHits } from '../db/schema';
import { HttpError, notFound } from '../http/errors';

/** What saved_searches.query holds. */
export interface StoredQuery {
  search: TextSearchRequest | GoalSearchRequest;
  url: string;
}

const MAX_PER_USER = 50;

export function storedQuery(row: { query: Record<string, unknown> }): StoredQuery {
  return row.query as unknown as StoredQuery;
}

function shape(row: typeof savedSearches.$inferSelect, hits: number) {
  const q = storedQuery(row);
  return {
    id: row.id,
    name: row.name,
    mode: row.mode,
    url: q.url,
    active: row.active,
    hits,
    createdAt: row.createdAt.toISOString(),
    lastNotifiedAt: row.lastNotifiedAt?.toISOString() ?? null,
  };
}
export type SavedSearchView = ReturnType<typeof shape>;

export async function createSavedSearch(user: CurrentUser, input: SavedSearchCreate): Promise<SavedSearchView> {
  const db = getDb();
  const [count] = await db
    .select({ n: sql<number>`count(*)` })
    .from(savedSearches)
    .where(eq(savedSearches.userId, user.id));
  if ((count?.n ?? 0) >= MAX_PER_USER)
    throw new HttpError(409, 'conflict', `You have ${MAX_PER_USER} saved searches; delete one to save another.`);
  const query: StoredQuery = { search: input.search, url: input.url };
  const [row] = await db
    .insert(savedSearches)
    .values({
      id: newId(),
      userId: user.id,
      name: input.name,
      mode: input.search.mode,
      query: query as unknown as Record<string, unknown>,
      unsubscribeTokenHash: newToken().hash,
    })
    .returning();
  return shape(row!, 0);
}

export async function listSavedSearches(user: CurrentUser): Promise<SavedSearchView[]> {
  const db = getDb();
  const rows = await db
    .select({
      s: savedSearches,
      hits: sql<number>`(select count(*) from ${savedSearchHits} h where h.saved_search_id = ${savedSearches.id})`,
    })
    .from(savedSearches)
    .where(eq(savedSearches.userId, user.id))
    .orderBy(desc(savedSearches.createdAt));
  return rows.map((r) => shape(r.s, Number(r.hits)));
}

export async function deleteSavedSearch(user: CurrentUser, id: string): Promise<void> {
  const rows = await getDb()
    .delete(savedSearches)
    .where(and(eq(savedSearches.id, id), eq(savedSearches.userId, user.id)))
    .returning({ id: savedSearches.id });
  if (!rows.length) throw notFound('No such saved search.');
}

export async function setSavedSearchActive(user: CurrentUser, id: string, active: boolean): Promise<SavedSearchView> {
  const db = getDb();
  const [row] = await db
    .update(savedSearches)
    .set({ active })
    .where(and(eq(savedSearches.id, id), eq(savedSearches.userId, user.id)))
    .returning();
  if (!row) throw notFound('No such saved search.');
  const [h] = await db
    .select({ n: sql<number>`count(*)` })
    .from(savedSearchHits)
    .where(eq(savedSearchHits.savedSearchId, id));
  return shape(row, Number(h?.n ?? 0));
}

/** Stops the e-mails of the saved search the token belongs to; null when the token matches none. */
export async function unsubscribe(token: string): Promise<{ name: string } | null> {
  const [row] = await getDb()
    .update(savedSearches)
    .set({ active: false })
    .where(eq(savedSearches.unsubscribeTokenHash, hashToken(token)))
    .returning({ name: savedSearches.name });
  return row ?? null;
}

/** The saved search a token would stop, for the confirmation page; null when none. */
export async function savedSearchForToken(token: string): Promise<{ name: string; active: boolean } | null> {
  const [row] = await getDb()
    .select({ name: savedSearches.name, active: savedSearches.active })
    .from(savedSearches)
    .where(eq(savedSearches.unsubscribeTokenHash, hashToken(token)))
    .limit(1);
  return row ?? null;
}
