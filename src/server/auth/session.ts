/**
 * The only module that knows the session library (lucia v3). Replacing it touches this file alone.
 */
import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import type { AstroCookies } from 'astro';
import { isSecureOrigin } from '../config';
import { getDb } from '../db/client';
import { sessions, users } from '../db/schema';

export const SESSION_COOKIE = 'ly_session';

function createLucia() {
  const adapter = new DrizzleSQLiteAdapter(getDb(), sessions, users);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(30, 'd'),
    sessionCookie: {
      name: SESSION_COOKIE,
      attributes: { secure: isSecureOrigin(), sameSite: 'lax' },
    },
    getUserAttributes: () => ({}),
  });
}

let lucia: ReturnType<typeof createLucia> | undefined;
function getLucia() {
  lucia ??= createLucia();
  return lucia;
}

export interface SessionInfo {
  id: string;
  userId: string;
  expiresAt: Date;
}

function setCookie(cookies: AstroCookies, cookie: { name: string; value: string; attributes: object }) {
  cookies.set(cookie.name, cookie.value, cookie.attributes as Parameters<AstroCookies['set']>[2]);
}

/** Starts a new session (a fresh id every sign-in, so a planted id is never promoted) and sets its cookie. */
export async function startSession(cookies: AstroCookies, userId: string): Promise<SessionInfo> {
  const session = await getLucia().createSession(userId, {});
  setCookie(cookies, getLucia().createSessionCookie(session.id));
  return { id: session.id, userId: session.userId, expiresAt: session.expiresAt };
}

/** Validates the cookie's session; refreshes the cookie when lucia extended it, clears it when invalid. */
export async function readSession(cookies: AstroCookies): Promise<SessionInfo | null> {
  const id = cookies.get(SESSION_COOKIE)?.value;
  if (!id) return null;
  const { session } = await getLucia().validateSession(id);
  if (!session) {
    setCookie(cookies, getLucia().createBlankSessionCookie());
    return null;
  }
  if (session.fresh) setCookie(cookies, getLucia().createSessionCookie(session.id));
  return { id: session.id, userId: session.userId, expiresAt: session.expiresAt };
}

export async function endSession(cookies: AstroCookies, sessionId: string | undefined): Promise<void> {
  if (sessionId) await getLucia().invalidateSession(sessionId);
  setCookie(cookies, getLucia().createBlankSessionCookie());
}

export async function endAllSessions(userId: string): Promise<void> {
  await getLucia().invalidateUserSessions(userId);
}
