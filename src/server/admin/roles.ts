import { and, asc, eq, like, ne, or, sql } from 'drizzle-orm';
import type { RoleName } from '../../lib/roles';
import { getDb } from '../db/client';
import { userRoles, users } from '../db/schema';
import { audit } from '../audit/log';
import { conflict, notFound } from '../http/errors';
import type { CurrentUser } from '../auth/users';

export async function listUsers(query = '', limit = 100) {
  const q = `%${query.trim().toLowerCase().replace(/[%_]/g, '')}%`;
  const rows = await getDb()
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      verified: sql<number>`${users.emailVerifiedAt} is not null`,
      createdAt: users.createdAt,
      roles: sql<string | null>`(select group_concat(${userRoles.role}, ',') from ${userRoles} where ${userRoles.userId} = ${users.id})`,
    })
    .from(users)
    .where(query ? or(like(sql`lower(${users.email})`, q), like(sql`lower(${users.name})`, q)) : undefined)
    .orderBy(asc(users.email))
    .limit(limit);
  return rows.map((r) => ({ ...r, verified: Boolean(r.verified), roles: (r.roles ? r.roles.split(',') : []).sort() as RoleName[] }));
}

async function requireExistingUser(userId: string) {
  const [u] = await getDb().select({ id: users.id }).from(users).where(eq(users.id, userId)).limit(1);
  if (!u) throw notFound('No such user.');
}

export async function grantRole(actor: CurrentUser, userId: string, role: RoleName) {
  await requireExistingUser(userId);
  await getDb().transaction(async (tx) => {
    const added = await tx
      .insert(userRoles)
      .values({ userId, role, grantedBy: actor.id })
      .onConflictDoNothing()
      .returning({ role: userRoles.role });
    if (added.length)
      await audit({ actorId: actor.id, action: 'role.granted', subjectType: 'user', subjectId: userId, data: { role } }, tx);
  });
}

export async function revokeRole(actor: CurrentUser, userId: string, role: RoleName) {
  await requireExistingUser(userId);
  await getDb().transaction(async (tx) => {
    if (role === 'admin') {
      const [{ others } = { others: 0 }] = await tx
        .select({ others: sql<number>`count(*)` })
        .from(userRoles)
        .where(and(eq(userRoles.role, 'admin'), ne(userRoles.userId, userId)));
      if (others === 0) throw conflict('Lightyard keeps at least one admin. Grant the role to someone else first.');
    }
    const removed = await tx
      .delete(userRoles)
      .where(and(eq(userRoles.userId, userId), eq(userRoles.role, role)))
      .returning({ role: userRoles.role });
    if (removed.length)
      await audit({ actorId: actor.id, action: 'role.revoked', subjectType: 'user', subjectId: userId, data: { role } }, tx);
  });
}
