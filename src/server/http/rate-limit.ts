import { and, eq, lt, sql } from 'drizzle-orm';
import { getDb } from '../db/client';
import { rateCounters } from '../db/schema';
import { HttpError } from './errors';

/**
 * A fixed-window counter per bucket in the database, so every app instance shares the count.
 * Throws 429 with Retry-After once `limit` requests fell into the current window.
 */
export async function rateLimit(bucket: string, limit: number, windowMs: number, now = Date.now()): Promise<void> {
  const windowStart = Math.floor(now / windowMs) * windowMs;
  const [row] = await getDb()
    .insert(rateCounters)
    .values({ bucket, windowStart, count: 1 })
    .onConflictDoUpdate({ target: [rateCounters.bucket, rateCounters.windowStart], set: { count: sql`${rateCounters.count} + 1` } })
    .returning({ count: rateCounters.count });
  if ((row?.count ?? 0) > limit) {
    const retry = Math.max(1, Math.ceil((windowStart + windowMs - now) / 1000));
    throw new HttpError(429, 'rate_limited', `Too many requests. Try again in ${retry} s.`, undefined, { 'retry-after': String(retry) });
  }
  if (row?.count === 1) {
    // first request of a new window: the bucket's older windows are done with
    await getDb()
      .delete(rateCounters)
      .where(and(eq(rateCounters.bucket, bucket), lt(rateCounters.windowStart, windowStart)));
  }
}
