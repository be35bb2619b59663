import { asc, eq } from 'drizzle-orm';
import type { RoleName } from '../../lib/roles';
import { getDb } from '../db/client';
import { labMemberships, labs, userRoles, users, type LabMemberRole } from '../db/schema';

export interface LabRef {
  id: string;
  slug: string;
  name: string;
  role: LabMemberRole;
}

export interface CurrentUser {
  id: string;
  email: string;
  name: string;
  emailVerified: boolean;
  roles: RoleName[];
  labs: LabRef[];
}

export async function loadCurrentUser(userId: string): Promise<CurrentUser | null> {
  const db = getDb();
  const [row] = await db.select().from(users).where(eq(users.id, userId)).limit(1);
  if (!row) return null;
  const [roleRows, labRows] = await Promise.all([
    db.select({ role: userRoles.role }).from(userRoles).where(eq(userRoles.userId, userId)).orderBy(asc(userRoles.role)),
    db
      .select({ id: labs.id, slug: labs.slug, name: labs.name, role: labMemberships.role })
      .from(labMemberships)
      .innerJoin(labs, eq(labs.id, labMemberships.labId))
      .where(eq(labMemberships.userId, userId))
      .orderBy(asc(labs.name)),
  ]);
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    emailVerified: row.emailVerifiedAt !== null,
    roles: roleRows.map((r) => r.role),
    labs: labRows,
  };
}

/** The public shape of GET /api/me. */
export function publicUser(u: CurrentUser) {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    emailVerified: u.emailVerified,
    roles: u.roles,
    labs: u.labs.map((l) => ({ id: l.id, slug: l.slug, name: l.name, role: l.role })),
  };
}
