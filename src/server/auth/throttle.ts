import { and, desc, eq, gt, lt } from 'drizzle-orm';
import { getDb } from '../db/client';
import { signInFailures } from '../db/schema';

export const THROTTLE_WINDOW_MS = 15 * 60_000;
export const ACCOUNT_FAILURE_LIMIT = 10;
// Looser per address: a whole institute can sit behind one NAT address.
export const ADDRESS_FAILURE_LIMIT = 100;

type Scope = 'account' | 'address';

/** Seconds until the limit frees a slot, or null when another attempt is allowed. */
async function blockedFor(scope: Scope, key: string, limit: number, now: number): Promise<number | null> {
  const recent = await getDb()
    .select({ at: signInFailures.at })
    .from(signInFailures)
    .where(and(eq(signInFailures.scope, scope), eq(signInFailures.key, key), gt(signInFailures.at, now - THROTTLE_WINDOW_MS)))
    .orderBy(desc(signInFailures.at))
    .limit(limit);
  if (recent.length < limit) return null;
  const oldestCounted = recent[recent.length - 1]!.at;
  return Math.max(1, Math.ceil((oldestCounted + THROTTLE_WINDOW_MS - now) / 1000));
}

export async function signInBlockedFor(email: string, address: string, now = Date.now()): Promise<number | null> {
  const [account, addr] = await Promise.all([
    blockedFor('account', email, ACCOUNT_FAILURE_LIMIT, now),
    blockedFor('address', address, ADDRESS_FAILURE_LIMIT, now),
  ]);
  if (account === null && addr === null) return null;
  return Math.max(account ?? 0, addr ?? 0);
}

export async function recordSignInFailure(email: string, address: string, now = Date.now()): Promise<void> {
  const db = getDb();
  await db.insert(signInFailures).values([
    { scope: 'account', key: email, at: now },
    { scope: 'address', key: address, at: now },
  ]);
  const expired = lt(signInFailures.at, now - THROTTLE_WINDOW_MS);
  await db.delete(signInFailures).where(and(eq(signInFailures.scope, 'account'), eq(signInFailures.key, email), expired));
  await db.delete(signInFailures).where(and(eq(signInFailures.scope, 'address'), eq(signInFailures.key, address), expired));
}

/** A successful sign-in forgives the account's earlier failures (not the address's). */
export async function clearAccountFailures(email: string): Promise<void> {
  await getDb()
    .delete(signInFailures)
    .where(and(eq(signInFailures.scope, 'account'), eq(signInFailures.key, email)));
}
