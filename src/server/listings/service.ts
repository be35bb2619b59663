import { and, asc, desc, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import type { ListingStatus } from '../../lib/listings/constants';
import { getDb } from '../db/client';
import { labMemberships, labs, listings, users, type Listing, type PublishedListing } from '../db/schema';
import { audit } from '../audit/log';
import { conflict, HttpError, notFound } from '../http/errors';
import { newId } from '../auth/tokens';
import type { CurrentUser } from '../auth/users';
import { kickOutbox, queueMail } from '../email/outbox';
import { getConfig } from '../config';
import { notifyListingChanged } from './events';
// The search index and saved-search matcher listen to listing changes in every process that makes them.
import '../search/subscribe';

export interface ListingFields {
  category: Listing['category'];
  title: string;
  description: string;
  condition: Listing['condition'];
  quantity: number;
  priceCents: number;
  currency: string;
  shipsTo: Listing['shipsTo'];
  specs: Record<string, unknown>;
}

/** Fields whose change on a live listing needs a moderator again (the approved version stays visible meanwhile). */
const REVIEWED_FIELDS = ['title', 'description', 'condition', 'priceCents', 'currency', 'specs'] as const;

/** Statuses in which the public sees the last approved version. */
export const PUBLIC_STATUSES: ListingStatus[] = ['live', 'sold-out', 'in-review', 'changes-requested'];

export function isPublic(l: Pick<Listing, 'published' | 'status'>): boolean {
  return l.published !== null && PUBLIC_STATUSES.includes(l.status);
}

function snapshot(l: Listing): PublishedListing {
  return {
    title: l.title,
    description: l.description,
    condition: l.condition,
    priceCents: l.priceCents,
    currency: l.currency,
    shipsTo: l.shipsTo,
    specs: l.specs,
    approvedAt: Date.now(),
  };
}

/** The lab a new listing belongs to: the one named, or the user's only lab. */
export function chooseLab(user: CurrentUser, labId?: string): string {
  if (labId) {
    if (!user.labs.some((l) => l.id === labId)) throw new HttpError(403, 'forbidden', 'You can only list for a lab you are a member of.');
    return labId;
  }
  if (user.labs.length === 0) throw new HttpError(403, 'forbidden', 'Create a lab or join one before listing parts.');
  if (user.labs.length > 1)
    throw new HttpError(400, 'validation_failed', 'You are in several labs: say which one lists this part.', { labId: 'Choose a lab.' });
  return user.labs[0]!.id;
}

export async function createListing(user: CurrentUser, labId: string, input: ListingFields): Promise<Listing> {
  const id = newId();
  const db = getDb();
  await db.transaction(async (tx) => {
    await tx.insert(listings).values({ id, labId, createdBy: user.id, status: 'draft', ...input });
    await audit(
      {
        actorId: user.id,
        action: 'listing.created',
        subjectType: 'listing',
        subjectId: id,
        data: { title: input.title, category: input.category },
      },
      tx,
    );
  });
  return (await db.select().from(listings).where(eq(listings.id, id)))[0]!;
}

async function bump(
  listing: Listing,
  set: Partial<Listing>,
  actor: CurrentUser,
  action: string,
  data?: Record<string, unknown>,
): Promise<Listing> {
  const db = getDb();
  const updated = await db.transaction(async (tx) => {
    const rows = await tx
      .update(listings)
      .set({ ...set, version: listing.version + 1, updatedAt: new Date() })
      .where(and(eq(listings.id, listing.id), eq(listings.version, listing.version)))
      .returning();
    if (!rows.length) throw conflict('Someone else changed this listing a moment ago. Reload it and try again.');
    await audit({ actorId: actor.id, action, subjectType: 'listing', subjectId: listing.id, data }, tx);
    return rows[0]!;
  });
  notifyListingChanged(updated.id);
  return updated;
}

function changedFields(listing: Listing, patch: Partial<ListingFields>): string[] {
  return Object.entries(patch)
    .filter(([k, v]) => JSON.stringify(v) !== JSON.stringify(listing[k as keyof Listing]))
    .map(([k]) => k);
}

export async function updateListing(
  actor: CurrentUser,
  listing: Listing,
  patch: Partial<ListingFields>,
  expectedVersion?: number,
): Promise<Listing> {
  if (expectedVersion !== undefined && expectedVersion !== listing.version) {
    throw conflict('This listing changed since you opened it. Reload it to see the latest version.');
  }
  if (listing.status === 'archived' || listing.status === 'rejected') {
    throw conflict(`A ${listing.status} listing cannot be edited. Duplicate it to list the part again.`);
  }
  if (patch.category && patch.category !== listing.category)
    throw new HttpError(400, 'validation_failed', 'The category of a listing cannot change.', { category: 'Fixed once created.' });
  const changed = changedFields(listing, patch);
  if (!changed.length) return listing;
  const set: Partial<Listing> = { ...patch };
  const needsReview = changed.some((f) => (REVIEWED_FIELDS as readonly string[]).includes(f));
  if (listing.published && (listing.status === 'live' || listing.status === 'sold-out')) {
    if (needsReview) {
      set.status = 'in-review';
      set.submittedAt = new Date();
    } else {
      // stock and shipping regions change in place; no review needed
      const quantity = patch.quantity ?? listing.quantity;
      set.published = { ...listing.published, shipsTo: patch.shipsTo ?? listing.published.shipsTo };
      set.status = quantity === 0 ? 'sold-out' : 'live';
    }
  }
  return bump(listing, set, actor, 'listing.updated', {
    fields: changed,
    ...(set.status && set.status !== listing.status ? { status: set.status } : {}),
  });
}

export async function submitListing(actor: CurrentUser, listing: Listing): Promise<Listing> {
  if (listing.status !== 'draft' && listing.status !== 'changes-requested') {
    throw conflict(`Only a draft or a listing with changes requested can be submitted; this one is ${listing.status}.`);
  }
  return bump(listing, { status: 'in-review', submittedAt: new Date() }, actor, 'listing.submitted');
}

export async function archiveListing(actor: CurrentUser, listing: Listing): Promise<Listing> {
  if (listing.status === 'archived') return listing;
  return bump(listing, { status: 'archived' }, actor, 'listing.archived', { from: listing.status });
}

export async function duplicateListing(actor: CurrentUser, listing: Listing): Promise<Listing> {
  const fields: ListingFields = {
    category: listing.category,
    title: `${listing.title} (copy)`.slice(0, 140),
    description: listing.description,
    condition: listing.condition,
    quantity: Math.max(1, listing.quantity),
    priceCents: listing.priceCents,
    currency: listing.currency,
    shipsTo: listing.shipsTo,
    specs: listing.specs,
  };
  const copy = await createListing(actor, listing.labId, fields);
  await audit({ actorId: actor.id, action: 'listing.duplicated', subjectType: 'listing', subjectId: copy.id, data: { from: listing.id } });
  return copy;
}

export type ModerationAction = 'approve' | 'request-changes' | 'reject';

export async function moderateListing(
  moderator: CurrentUser,
  listing: Listing,
  action: ModerationAction,
  reason?: string,
): Promise<Listing> {
  if (listing.status !== 'in-review') throw conflict(`Only listings in review can be moderated; this one is ${listing.status}.`);
  if (action !== 'approve' && !reason?.trim()) {
    throw new HttpError(400, 'validation_failed', 'Say what the seller should change, or why it is rejected.', {
      reason: 'A reason is required.',
    });
  }
  const set: Partial<Listing> =
    action === 'approve'
      ? { status: listing.quantity > 0 ? 'live' : 'sold-out', published: snapshot(listing), reviewReason: null }
      : action === 'request-changes'
        ? { status: 'changes-requested', reviewReason: reason!.trim() }
        : { status: 'rejected', reviewReason: reason!.trim(), published: null };
  const updated = await bump(listing, set, moderator, `moderation.${action}`, reason ? { reason: reason.trim() } : undefined);
  await mailLab(listing.labId, decisionMail(updated, action, reason));
  return updated;
}

export async function flagListing(
  moderator: CurrentUser,
  listing: Listing,
  flags: Pick<Listing, 'hazards' | 'exportControlled' | 'exportNote'>,
): Promise<Listing> {
  return bump(listing, flags, moderator, 'moderation.flags', { ...flags });
}

function decisionMail(l: Listing, action: ModerationAction, reason?: string) {
  const url = new URL(`/desk/listings/${l.id}`, getConfig().APP_ORIGIN).toString();
  const what =
    action === 'approve'
      ? `"${l.title}" is approved and live on Lightyard.`
      : action === 'request-changes'
        ? `A moderator asks for changes to "${l.title}" before it goes live:\n\n${reason}`
        : `"${l.title}" was rejected by a moderator:\n\n${reason}`;
  const subject =
    action === 'approve' ? `Live: ${l.title}` : action === 'request-changes' ? `Changes requested: ${l.title}` : `Rejected: ${l.title}`;
  return { subject, text: `${what}\n\n${url}\n` };
}

/** Mails everyone in the lab (owners and members) in one transaction through the outbox. */
export async function mailLab(labId: string, mail: { subject: string; text: string }) {
  const db = getDb();
  const people = await db
    .select({ email: users.email })
    .from(labMemberships)
    .innerJoin(users, eq(users.id, labMemberships.userId))
    .where(eq(labMemberships.labId, labId));
  if (!people.length) return;
  await db.transaction(async (tx) => {
    for (const p of people) await queueMail({ to: p.email, ...mail }, tx);
  });
  kickOutbox();
}

export interface ListingQuery {
  category?: Listing['category'];
  /** Words that must all appear in the approved title or description. */
  q?: string;
  limit: number;
  offset: number;
}

/** Publicly visible listings, newest approval first. */
export async function listPublic(q: ListingQuery) {
  const words = (q.q ?? '').toLowerCase().split(/\s+/).filter(Boolean).slice(0, 8);
  const text = sql`lower(json_extract(${listings.published}, '$.title') || ' ' || json_extract(${listings.published}, '$.description'))`;
  const where = and(
    isNotNull(listings.published),
    inArray(listings.status, PUBLIC_STATUSES),
    q.category ? eq(listings.category, q.category) : undefined,
    ...words.map((w) => sql`instr(${text}, ${w}) > 0`),
  );
  const db = getDb();
  const [rows, [{ n } = { n: 0 }]] = await Promise.all([
    db
      .select({ listing: listings, labName: labs.name, labCountry: labs.country })
      .from(listings)
      .innerJoin(labs, eq(labs.id, listings.labId))
      .where(where)
      .orderBy(desc(sql`json_extract(${listings.published}, '$.approvedAt')`))
      .limit(q.limit)
      .offset(q.offset),
    db
      .select({ n: sql<number>`count(*)` })
      .from(listings)
      .where(where),
  ]);
  return { total: n, items: rows.map((r) => publicShape(r.listing, { name: r.labName, country: r.labCountry })) };
}

/** The lab's own listings, every status. */
export async function listMine(user: CurrentUser, q: ListingQuery & { status?: ListingStatus }) {
  const labIds = user.labs.map((l) => l.id);
  if (!labIds.length) return { total: 0, items: [] };
  const where = and(
    inArray(listings.labId, labIds),
    q.category ? eq(listings.category, q.category) : undefined,
    q.status ? eq(listings.status, q.status) : undefined,
  );
  const db = getDb();
  const [rows, [{ n } = { n: 0 }]] = await Promise.all([
    db.select().from(listings).where(where).orderBy(desc(listings.updatedAt)).limit(q.limit).offset(q.offset),
    db
      .select({ n: sql<number>`count(*)` })
      .from(listings)
      .where(where),
  ]);
  return { total: n, items: rows.map(ownerShape) };
}

export function publicShape(l: Listing, lab: { name: string; country: string }) {
  const p = l.published!;
  return {
    id: l.id,
    category: l.category,
    status: l.quantity > 0 ? 'live' : 'sold-out',
    title: p.title,
    description: p.description,
    condition: p.condition,
    quantity: l.quantity,
    priceCents: p.priceCents,
    currency: p.currency,
    shipsTo: p.shipsTo,
    specs: p.specs,
    hazards: l.hazards,
    exportControlled: l.exportControlled,
    exportNote: l.exportNote,
    lab: { id: l.labId, ...lab },
    approvedAt: new Date(p.approvedAt).toISOString(),
  };
}

export function ownerShape(l: Listing) {
  return {
    id: l.id,
    labId: l.labId,
    category: l.category,
    status: l.status,
    title: l.title,
    description: l.description,
    condition: l.condition,
    quantity: l.quantity,
    priceCents: l.priceCents,
    currency: l.currency,
    shipsTo: l.shipsTo,
    specs: l.specs,
    reviewReason: l.reviewReason,
    hazards: l.hazards,
    exportControlled: l.exportControlled,
    exportNote: l.exportNote,
    version: l.version,
    published: l.published,
    submittedAt: l.submittedAt?.toISOString() ?? null,
    updatedAt: l.updatedAt.toISOString(),
    createdAt: l.createdAt.toISOString(),
  };
}

export async function labOf(labId: string) {
  const [lab] = await getDb().select().from(labs).where(eq(labs.id, labId)).limit(1);
  if (!lab) throw notFound('No such lab.');
  return lab;
}

/** Review queue: in-review listings, oldest submission first. */
export async function reviewQueue() {
  return getDb()
    .select({ listing: listings, labName: labs.name })
    .from(listings)
    .innerJoin(labs, eq(labs.id, listings.labId))
    .where(eq(listings.status, 'in-review'))
    .orderBy(asc(listings.submittedAt));
}

/** What differs between the last approved version and the one under review. */
export function changesSinceApproval(l: Listing): { field: string; before: unknown; after: unknown }[] {
  if (!l.published) return [];
  const out: { field: string; before: unknown; after: unknown }[] = [];
  for (const f of REVIEWED_FIELDS) {
    if (f === 'specs') {
      const keys = new Set([...Object.keys(l.published.specs), ...Object.keys(l.specs)]);
      for (const k of keys) {
        const before = l.published.specs[k];
        const after = l.specs[k];
        if (JSON.stringify(before) !== JSON.stringify(after)) out.push({ field: `specs.${k}`, before, after });
      }
    } else if (JSON.stringify(l.published[f]) !== JSON.stringify(l[f])) {
      out.push({ field: f, before: l.published[f], after: l[f] });
    }
  }
  return out;
}
