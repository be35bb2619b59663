/**
 * Every protected page and endpoint calls one of these first. They throw HttpError (401/403/404);
 * endpoints turn that into JSON, pages into a redirect or the 403 page (see pageGuard).
 */
import type { AstroGlobal } from 'astro';
import { and, eq, or } from 'drizzle-orm';
import type { RoleName } from '../../lib/roles';
import { getDb } from '../db/client';
import { labMemberships, labs, type Lab, type LabMemberRole } from '../db/schema';
import { forbidden, HttpError, notFound, unauthenticated } from '../http/errors';
import type { CurrentUser } from './users';

type WithLocals = { locals: App.Locals };

export function requireUser(ctx: WithLocals): CurrentUser {
  const user = ctx.locals.user;
  if (!user) throw unauthenticated();
  return user;
}

/** For actions that must come from a confirmed address: listing, checking out, inviting. */
export function requireVerifiedUser(ctx: WithLocals): CurrentUser {
  const user = requireUser(ctx);
  if (!user.emailVerified) {
    throw new HttpError(
      403,
      'email_unverified',
      'Confirm your e-mail address first: open the link we sent you, or ask for a new one on your account page.',
    );
  }
  return user;
}

export function hasRole(user: CurrentUser | null, ...roles: RoleName[]): boolean {
  return !!user && roles.some((r) => user.roles.includes(r));
}

/** Passes when the user holds any one of the given roles. */
export function requireRole(ctx: WithLocals, ...roles: RoleName[]): CurrentUser {
  const user = requireUser(ctx);
  if (!hasRole(user, ...roles)) throw forbidden(`This needs the ${roles.join(' or ')} role.`);
  return user;
}

export interface LabMembership {
  user: CurrentUser;
  lab: Lab;
  role: LabMemberRole;
}

/** The lab by id or slug, and the caller's membership in it; `owner: true` demands the owner role. */
export async function requireLabMember(ctx: WithLocals, labIdOrSlug: string, opts: { owner?: boolean } = {}): Promise<LabMembership> {
  const user = requireUser(ctx);
  const db = getDb();
  const [lab] = await db
    .select()
    .from(labs)
    .where(or(eq(labs.id, labIdOrSlug), eq(labs.slug, labIdOrSlug)))
    .limit(1);
  if (!lab) throw notFound('No such lab.');
  const [m] = await db
    .select({ role: labMemberships.role })
    .from(labMemberships)
    .where(and(eq(labMemberships.labId, lab.id), eq(labMemberships.userId, user.id)))
    .limit(1);
  if (!m) throw forbidden('Only members of this lab can do this.');
  if (opts.owner && m.role !== 'owner') throw forbidden('Only the lab owner can do this.');
  return { user, lab, role: m.role };
}

/**
 * Runs a guard for a page. Not signed in → redirect to sign-in (and back); forbidden → the 403 page
 * with status 403; missing → the 404 page. Returns null when the guard passes.
 */
export async function pageGuard(Astro: AstroGlobal, guard: () => unknown): Promise<Response | null> {
  try {
    await guard();
    return null;
  } catch (err) {
    if (!(err instanceof HttpError)) throw err;
    if (err.status === 401) {
      const next = Astro.url.pathname + Astro.url.search;
      return Astro.redirect(`/sign-in?next=${encodeURIComponent(next)}`, 303);
    }
    if (err.status === 404) return Astro.rewrite('/404');
    Astro.locals.denied = err.message;
    return Astro.rewrite('/403');
  }
}
