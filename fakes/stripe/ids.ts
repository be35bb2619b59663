import { randomBytes } from 'node:crypto';

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

/** `evt_…`, `req_…`: the provider's ids are a type prefix and a random base62 tail. */
export function newId(prefix: string, length = 24): string {
  const bytes = randomBytes(length);
  let tail = '';
  for (const byte of bytes) tail += ALPHABET[byte % ALPHABET.length];
  return `${prefix}_${tail}`;
}

export function unixSeconds(date = new Date()): number {
  return Math.floor(date.getTime() / 1000);
}
