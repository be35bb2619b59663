import { createHash, randomBytes } from 'node:crypto';

/** A URL-safe secret for e-mail links; the database keeps only its SHA-256. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export function newId(): string {
  return crypto.randomUUID();
}
