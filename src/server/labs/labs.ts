import { and, asc, eq, gt, isNull } from 'drizzle-orm';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { labInvites, labMemberships, labs, userRoles, users } from '../db/schema';
import { audit } from '../audit/log';
import { kickOutbox, queueMail } from '../email/outbox';
import { labInviteMail } from '../email/templates';
import { conflict, HttpError } from '../http/errors';
import { hashToken, newId, newToken } from '../auth/tokens';
import type { CurrentUser } from '../auth/users';

const INVITE_TTL_MS = 7 * 24 * 3600_000;

export function slugify(name: string): string {
  return (
    name
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'lab'
  );
}

async function uniqueSlug(name: string): Promise<string> {
  const base = slugify(name);
  for (let i = 1; ; i++) {
    const slug = i === 1 ? base : `${base}-${i}`;
    const taken = await getDb().select({ id: labs.id }).from(labs).where(eq(labs.slug, slug)).limit(1);
    if (!taken.length) return slug;
  }
}

/** The creator becomes the lab's owner and, to list its parts, a seller. */
export async function createLab(owner: Pick<CurrentUser, 'id'>, input: { name: string; institute: string; country: string }) {
  const id = newId();
  const slug = await uniqueSlug(input.name);
  await getDb().transaction(async (tx) => {
    await tx.insert(labs).values({ id, slug, ...input });
    await tx.insert(labMemberships).values({ labId: id, userId: owner.id, role: 'owner' });
    await tx.insert(userRoles).values({ userId: owner.id, role: 'seller', grantedBy: owner.id }).onConflictDoNothing();
    await audit({ actorId: owner.id, action: 'lab.created', subjectType: 'lab', subjectId: id, data: input }, tx);
  });
  return { id, slug, ...input };
}

export async function labMembers(labId: string) {
  return getDb()
    .select({ userId: users.id, name: users.name, email: users.email, role: labMemberships.role, since: labMemberships.createdAt })
    .from(labMemberships)
    .innerJoin(users, eq(users.id, labMemberships.userId))
    .where(eq(labMemberships.labId, labId))
    .orderBy(asc(labMemberships.role), asc(users.name));
}

export async function pendingInvites(labId: string) {
  return getDb()
    .select({ id: labInvites.id, email: labInvites.email, expiresAt: labInvites.expiresAt, createdAt: labInvites.createdAt })
    .from(labInvites)
    .where(and(eq(labInvites.labId, labId), isNull(labInvites.acceptedAt), gt(labInvites.expiresAt, new Date())))
    .orderBy(asc(labInvites.createdAt));
}

export async function inviteMember(inviter: CurrentUser, lab: { id: string; name: string }, email: string) {
  const db = getDb();
  const already = await db
    .select({ id: users.id })
    .from(labMemberships)
    .innerJoin(users, eq(users.id, labMemberships.userId))
    .where(and(eq(labMemberships.labId, lab.id), eq(users.email, email)))
    .limit(1);
  if (already.length) throw conflict(`${email} is already a member of ${lab.name}.`, { email: 'Already a member.' });
  const { token, hash } = newToken();
  const id = newId();
  await db.transaction(async (tx) => {
    await tx
      .insert(labInvites)
      .values({ id, labId: lab.id, email, tokenHash: hash, invitedBy: inviter.id, expiresAt: new Date(Date.now() + INVITE_TTL_MS) });
    const url = new URL(`/invites/accept?token=${token}`, getConfig().APP_ORIGIN).toString();
    await queueMail(labInviteMail(email, inviter.name, lab.name, url), tx);
    await audit({ actorId: inviter.id, action: 'lab.member_invited', subjectType: 'lab', subjectId: lab.id, data: { email } }, tx);
  });
  kickOutbox();
  return { id, email };
}

export async function describeInvite(token: string) {
  const [row] = await getDb()
    .select({
      id: labInvites.id,
      email: labInvites.email,
      labName: labs.name,
      labSlug: labs.slug,
      acceptedAt: labInvites.acceptedAt,
      expiresAt: labInvites.expiresAt,
    })
    .from(labInvites)
    .innerJoin(labs, eq(labs.id, labInvites.labId))
    .where(eq(labInvites.tokenHash, hashToken(token)))
    .limit(1);
  return row ?? null;
}

/** Joins the lab named by the invitation. The signed-in account must be the invited address; opening the link proves it. */
export async function acceptInvite(user: CurrentUser, token: string) {
  const db = getDb();
  const [invite] = await db
    .select()
    .from(labInvites)
    .where(eq(labInvites.tokenHash, hashToken(token)))
    .limit(1);
  if (!invite || invite.acceptedAt || invite.expiresAt.getTime() <= Date.now()) {
    throw new HttpError(400, 'invalid_token', 'This invitation is invalid, used or expired. Ask the lab owner for a new one.');
  }
  if (invite.email !== user.email) {
    throw new HttpError(403, 'wrong_account', `This invitation was sent to ${invite.email}. Sign in with that address to accept it.`);
  }
  await db.transaction(async (tx) => {
    const claimed = await tx
      .update(labInvites)
      .set({ acceptedAt: new Date(), acceptedBy: user.id })
      .where(and(eq(labInvites.id, invite.id), isNull(labInvites.acceptedAt)))
      .returning({ id: labInvites.id });
    if (!claimed.length) throw new HttpError(400, 'invalid_token', 'This invitation was already used.');
    await tx.insert(labMemberships).values({ labId: invite.labId, userId: user.id, role: 'member' }).onConflictDoNothing();
    await tx.insert(userRoles).values({ userId: user.id, role: 'seller', grantedBy: invite.invitedBy }).onConflictDoNothing();
    if (!user.emailVerified) await tx.update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, user.id));
    await audit({ actorId: user.id, action: 'lab.member_joined', subjectType: 'lab', subjectId: invite.labId }, tx);
  });
  const [lab] = await db.select().from(labs).where(eq(labs.id, invite.labId));
  return lab!;
}

export async function removeMember(actor: CurrentUser, labId: string, userId: string) {
  const db = getDb();
  const members = await labMembers(labId);
  const target = members.find((m) => m.userId === userId);
  if (!target) throw new HttpError(404, 'not_found', 'That person is not a member of this lab.');
  if (target.role === 'owner' && members.filter((m) => m.role === 'owner').length === 1) {
    throw conflict('A lab keeps at least one owner. Make someone else owner first.');
  }
  await db.transaction(async (tx) => {
    await tx.delete(labMemberships).where(and(eq(labMemberships.labId, labId), eq(labMemberships.userId, userId)));
    await audit({ actorId: actor.id, action: 'lab.member_removed', subjectType: 'lab', subjectId: labId, data: { userId } }, tx);
  });
}
