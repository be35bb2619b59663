/**
 * Builders shared by the demo seed and the tests, so both describe people and labs the same way.
 */
import type { RoleName } from '../../lib/roles';
import { hashPassword } from '../auth/password';
import { newId } from '../auth/tokens';
import { getDb } from './client';
import { labMemberships, labs, listings, userRoles, users, type LabMemberRole, type Listing } from './schema';
import { slugify } from '../labs/labs';

export interface UserSpec {
  email: string;
  name: string;
  password: string;
  roles?: RoleName[];
  verified?: boolean;
}

export async function buildUser(spec: UserSpec): Promise<{ id: string; email: string }> {
  const id = newId();
  const db = getDb();
  await db.insert(users).values({
    id,
    email: spec.email.toLowerCase(),
    name: spec.name,
    passwordHash: await hashPassword(spec.password),
    emailVerifiedAt: spec.verified === false ? null : new Date(),
  });
  const roles = spec.roles ?? ['buyer'];
  if (roles.length) await db.insert(userRoles).values(roles.map((role) => ({ userId: id, role })));
  return { id, email: spec.email.toLowerCase() };
}

export interface LabSpec {
  name: string;
  institute: string;
  country: string;
  members: { userId: string; role: LabMemberRole }[];
}

export async function buildLab(spec: LabSpec): Promise<{ id: string; slug: string }> {
  const id = newId();
  const slug = slugify(spec.name);
  const db = getDb();
  await db.insert(labs).values({ id, slug, name: spec.name, institute: spec.institute, country: spec.country });
  if (spec.members.length) await db.insert(labMemberships).values(spec.members.map((m) => ({ labId: id, ...m })));
  return { id, slug };
}

export type ListingSpec = Pick<
  Listing,
  'labId' | 'category' | 'title' | 'condition' | 'quantity' | 'priceCents' | 'currency' | 'shipsTo' | 'specs'
> &
  Partial<
    Pick<Listing, 'status' | 'description' | 'published' | 'createdBy' | 'hazards' | 'exportControlled' | 'exportNote' | 'submittedAt'>
  >;

export async function buildListing(spec: ListingSpec): Promise<{ id: string }> {
  const id = newId();
  await getDb()
    .insert(listings)
    .values({ id, description: '', status: 'draft', ...spec });
  return { id };
}
