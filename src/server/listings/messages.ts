import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { listingMessages, listingReports, listings, listingThreads, users, type Listing } from '../db/schema';
import { audit } from '../audit/log';
import { kickOutbox, queueMail } from '../email/outbox';
import { conflict, forbidden, notFound } from '../http/errors';
import { newId } from '../auth/tokens';
import { hasRole } from '../auth/guards';
import type { CurrentUser } from '../auth/users';
import { mailLab } from './service';

const threadUrl = (id: string) => new URL(`/messages/${id}`, getConfig().APP_ORIGIN).toString();

/** A buyer's question opens (or continues) their thread with the listing's lab; the lab is told by e-mail. */
export async function askQuestion(buyer: CurrentUser, listing: Listing, body: string): Promise<{ threadId: string }> {
  if (buyer.labs.some((l) => l.id === listing.labId)) throw conflict('This is your own lab’s listing.');
  const db = getDb();
  const now = new Date();
  const threadId = await db.transaction(async (tx) => {
    const [existing] = await tx
      .select({ id: listingThreads.id })
      .from(listingThreads)
      .where(and(eq(listingThreads.listingId, listing.id), eq(listingThreads.buyerId, buyer.id)))
      .limit(1);
    const id = existing?.id ?? newId();
    if (!existing) await tx.insert(listingThreads).values({ id, listingId: listing.id, buyerId: buyer.id, lastMessageAt: now });
    else await tx.update(listingThreads).set({ lastMessageAt: now }).where(eq(listingThreads.id, id));
    await tx.insert(listingMessages).values({ id: newId(), threadId: id, authorId: buyer.id, body });
    return id;
  });
  const title = listing.published?.title ?? listing.title;
  await mailLab(listing.labId, {
    subject: `Question about ${title}`,
    text: `${buyer.name} asks about "${title}":\n\n${body}\n\nAnswer in Lightyard: ${threadUrl(threadId)}\n`,
  });
  return { threadId };
}

async function loadThread(threadId: string) {
  const [row] = await getDb()
    .select({ thread: listingThreads, listing: listings })
    .from(listingThreads)
    .innerJoin(listings, eq(listings.id, listingThreads.listingId))
    .where(eq(listingThreads.id, threadId))
    .limit(1);
  if (!row) throw notFound('No such conversation.');
  return row;
}

/** The buyer who asked, the lab's members, and moderators (for reports) may read a thread. */
export async function requireThreadParticipant(user: CurrentUser, threadId: string) {
  const row = await loadThread(threadId);
  const side = row.thread.buyerId === user.id ? 'buyer' : user.labs.some((l) => l.id === row.listing.labId) ? 'lab' : null;
  if (!side && !hasRole(user, 'moderator', 'admin')) throw forbidden('This conversation is between the buyer and the lab.');
  return { ...row, side };
}

export async function threadMessages(threadId: string) {
  return getDb()
    .select({
      id: listingMessages.id,
      body: listingMessages.body,
      createdAt: listingMessages.createdAt,
      authorId: listingMessages.authorId,
      authorName: users.name,
    })
    .from(listingMessages)
    .leftJoin(users, eq(users.id, listingMessages.authorId))
    .where(eq(listingMessages.threadId, threadId))
    .orderBy(asc(listingMessages.createdAt));
}

export async function reply(user: CurrentUser, threadId: string, body: string) {
  const { thread, listing, side } = await requireThreadParticipant(user, threadId);
  if (!side) throw forbidden('Only the buyer and the lab write in this conversation.');
  const db = getDb();
  const id = newId();
  await db.transaction(async (tx) => {
    await tx.insert(listingMessages).values({ id, threadId, authorId: user.id, body });
    await tx.update(listingThreads).set({ lastMessageAt: new Date() }).where(eq(listingThreads.id, threadId));
  });
  const title = listing.published?.title ?? listing.title;
  const text = `${user.name} wrote about "${title}":\n\n${body}\n\nReply in Lightyard: ${threadUrl(threadId)}\n`;
  if (side === 'lab') {
    const [buyer] = await db.select({ email: users.email }).from(users).where(eq(users.id, thread.buyerId));
    if (buyer) {
      await queueMail({ to: buyer.email, subject: `Answer about ${title}`, text });
      kickOutbox();
    }
  } else {
    await mailLab(listing.labId, { subject: `Question about ${title}`, text });
  }
  return { id };
}

/** Threads the user takes part in: as the buyer, or through their labs. */
export async function myThreads(user: CurrentUser) {
  const labIds = user.labs.map((l) => l.id);
  const db = getDb();
  const rows = await db
    .select({
      id: listingThreads.id,
      listingId: listings.id,
      title: listings.title,
      buyerId: listingThreads.buyerId,
      buyerName: users.name,
      lastMessageAt: listingThreads.lastMessageAt,
      labId: listings.labId,
    })
    .from(listingThreads)
    .innerJoin(listings, eq(listings.id, listingThreads.listingId))
    .innerJoin(users, eq(users.id, listingThreads.buyerId))
    .orderBy(desc(listingThreads.lastMessageAt))
    .limit(200);
  return rows.filter((r) => r.buyerId === user.id || labIds.includes(r.labId));
}

export async function reportListing(reporter: CurrentUser, listing: Listing, reason: string) {
  const id = newId();
  await getDb().transaction(async (tx) => {
    await tx.insert(listingReports).values({ id, listingId: listing.id, reporterId: reporter.id, reason });
    await audit(
      { actorId: reporter.id, action: 'listing.reported', subjectType: 'listing', subjectId: listing.id, data: { reportId: id } },
      tx,
    );
  });
  return { id };
}

export async function openReports() {
  return getDb()
    .select({
      id: listingReports.id,
      reason: listingReports.reason,
      createdAt: listingReports.createdAt,
      listingId: listings.id,
      title: listings.title,
      reporter: users.name,
    })
    .from(listingReports)
    .innerJoin(listings, eq(listings.id, listingReports.listingId))
    .leftJoin(users, eq(users.id, listingReports.reporterId))
    .where(inArray(listingReports.status, ['open']))
    .orderBy(asc(listingReports.createdAt));
}

export async function resolveReport(moderator: CurrentUser, reportId: string) {
  const rows = await getDb()
    .update(listingReports)
    .set({ status: 'resolved', resolvedBy: moderator.id })
    .where(eq(listingReports.id, reportId))
    .returning({ listingId: listingReports.listingId });
  if (!rows.length) throw notFound('No such report.');
  await audit({
    actorId: moderator.id,
    action: 'moderation.report_resolved',
    subjectType: 'listing',
    subjectId: rows[0]!.listingId,
    data: { reportId },
  });
}
