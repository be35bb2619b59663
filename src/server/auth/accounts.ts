import { and, eq, gt, isNull } from 'drizzle-orm';
import { getConfig } from '../config';
import { getDb } from '../db/client';
import { emailTokens, userRoles, users } from '../db/schema';
import { conflict, HttpError } from '../http/errors';
import { kickOutbox, queueMail } from '../email/outbox';
import { resetMail, verificationMail } from '../email/templates';
import { audit } from '../audit/log';
import { decoyHash, hashPassword, verifyPassword } from './password';
import { clearAccountFailures, recordSignInFailure, signInBlockedFor } from './throttle';
import { hashToken, newId, newToken } from './tokens';

const VERIFY_TTL_MS = 48 * 3600_000;
const RESET_TTL_MS = 3600_000;

const appUrl = (path: string) => new URL(path, getConfig().APP_ORIGIN).toString();

export async function signUp(input: { email: string; password: string; name: string }) {
  const db = getDb();
  const existing = await db.select({ id: users.id }).from(users).where(eq(users.email, input.email)).limit(1);
  if (existing.length)
    throw conflict('An account with this e-mail address already exists. Sign in or reset the password.', { email: 'Already registered.' });
  const passwordHash = await hashPassword(input.password);
  const id = newId();
  const { token, hash } = newToken();
  try {
    await db.transaction(async (tx) => {
      await tx.insert(users).values({ id, email: input.email, name: input.name, passwordHash });
      await tx.insert(userRoles).values({ userId: id, role: 'buyer' });
      await tx
        .insert(emailTokens)
        .values({ id: newId(), userId: id, kind: 'verify', tokenHash: hash, expiresAt: new Date(Date.now() + VERIFY_TTL_MS) });
      await queueMail(verificationMail(input.email, input.name, appUrl(`/verify?token=${token}`)), tx);
      await audit({ actorId: id, action: 'account.created', subjectType: 'user', subjectId: id }, tx);
    });
  } catch (err) {
    if (/UNIQUE constraint failed: users\.email/.test(String((err as Error).message))) {
      throw conflict('An account with this e-mail address already exists. Sign in or reset the password.', {
        email: 'Already registered.',
      });
    }
    throw err;
  }
  kickOutbox();
  return { id, email: input.email, name: input.name };
}

/** Marks a token used if it is valid now; single use even under concurrent requests (the update is conditional). */
async function consumeToken(token: string, kind: 'verify' | 'reset'): Promise<string | null> {
  const now = new Date();
  const rows = await getDb()
    .update(emailTokens)
    .set({ usedAt: now })
    .where(
      and(
        eq(emailTokens.tokenHash, hashToken(token)),
        eq(emailTokens.kind, kind),
        isNull(emailTokens.usedAt),
        gt(emailTokens.expiresAt, now),
      ),
    )
    .returning({ userId: emailTokens.userId });
  return rows[0]?.userId ?? null;
}

export async function verifyEmail(token: string): Promise<{ userId: string }> {
  const userId = await consumeToken(token, 'verify');
  if (!userId) throw new HttpError(400, 'invalid_token', 'This confirmation link is invalid, used or expired. Sign in to get a new one.');
  await getDb()
    .update(users)
    .set({ emailVerifiedAt: new Date(), updatedAt: new Date() })
    .where(and(eq(users.id, userId), isNull(users.emailVerifiedAt)));
  await audit({ actorId: userId, action: 'account.verified', subjectType: 'user', subjectId: userId });
  return { userId };
}

export async function resendVerification(userId: string): Promise<void> {
  const db = getDb();
  const [u] = await db.select().from(users).where(eq(users.id, userId)).limit(1);
  if (!u || u.emailVerifiedAt) return;
  const { token, hash } = newToken();
  await db.transaction(async (tx) => {
    await tx
      .update(emailTokens)
      .set({ usedAt: new Date() })
      .where(and(eq(emailTokens.userId, userId), eq(emailTokens.kind, 'verify'), isNull(emailTokens.usedAt)));
    await tx
      .insert(emailTokens)
      .values({ id: newId(), userId, kind: 'verify', tokenHash: hash, expiresAt: new Date(Date.now() + VERIFY_TTL_MS) });
    await queueMail(verificationMail(u.email, u.name, appUrl(`/verify?token=${token}`)), tx);
  });
  kickOutbox();
}

export const SIGN_IN_REFUSED = 'The e-mail address or password is not right.';

/** Checks the limits first, then the password; an unknown e-mail costs the same time and gives the same message. */
export async function signIn(email: string, password: string, address: string): Promise<{ userId: string }> {
  const wait = await signInBlockedFor(email, address);
  if (wait !== null) {
    throw new HttpError(
      429,
      'rate_limited',
      `Too many failed sign-in attempts. Try again in ${Math.ceil(wait / 60)} minute(s), or reset your password.`,
      undefined,
      {
        'retry-after': String(wait),
      },
    );
  }
  const [u] = await getDb().select().from(users).where(eq(users.email, email)).limit(1);
  const ok = await verifyPassword(u?.passwordHash ?? (await decoyHash()), password);
  if (!u || !ok) {
    await recordSignInFailure(email, address);
    throw new HttpError(401, 'invalid_credentials', SIGN_IN_REFUSED);
  }
  await clearAccountFailures(email);
  return { userId: u.id };
}

/** Always answers the same way, whether or not the address has an account. */
export async function requestPasswordReset(email: string): Promise<void> {
  const db = getDb();
  const [u] = await db.select().from(users).where(eq(users.email, email)).limit(1);
  if (!u) return;
  const { token, hash } = newToken();
  await db.transaction(async (tx) => {
    await tx
      .insert(emailTokens)
      .values({ id: newId(), userId: u.id, kind: 'reset', tokenHash: hash, expiresAt: new Date(Date.now() + RESET_TTL_MS) });
    await queueMail(resetMail(u.email, u.name, appUrl(`/reset-password?token=${token}`)), tx);
  });
  kickOutbox();
}

/** Sets the new password and ends every session; opening the link proves the mailbox, so the address counts as confirmed. */
export async function resetPassword(token: string, password: string): Promise<{ userId: string }> {
  const userId = await consumeToken(token, 'reset');
  if (!userId) throw new HttpError(400, 'invalid_token', 'This reset link is invalid, used or expired. Ask for a new one.');
  const passwordHash = await hashPassword(password);
  const db = getDb();
  const [u] = await db.select({ verified: users.emailVerifiedAt }).from(users).where(eq(users.id, userId));
  await db
    .update(users)
    .set({ passwordHash, updatedAt: new Date(), emailVerifiedAt: u?.verified ?? new Date() })
    .where(eq(users.id, userId));
  await audit({ actorId: userId, action: 'account.password_reset', subjectType: 'user', subjectId: userId });
  return { userId };
}

export async function changePassword(userId: string, currentPassword: string, newPassword: string): Promise<void> {
  const db = getDb();
  const [u] = await db.select().from(users).where(eq(users.id, userId)).limit(1);
  if (!u || !(await verifyPassword(u.passwordHash, currentPassword))) {
    throw new HttpError(400, 'validation_failed', 'The current password is not right.', { currentPassword: 'Not right.' });
  }
  await db
    .update(users)
    .set({ passwordHash: await hashPassword(newPassword), updatedAt: new Date() })
    .where(eq(users.id, userId));
  await audit({ actorId: userId, action: 'account.password_changed', subjectType: 'user', subjectId: userId });
}

export async function updateProfile(userId: string, name: string): Promise<void> {
  await getDb().update(users).set({ name, updatedAt: new Date() }).where(eq(users.id, userId));
}
