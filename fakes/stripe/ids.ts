import { randomBytes } from 'node:crypto';

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

/** Random base62 characters, the tail of the provider's ids and secrets. */
export function randomToken(length: number): string {
  let token = '';
  for (const byte of randomBytes(length)) token += ALPHABET[byte % ALPHABET.length];
  return token;
}

/** `evt_…`, `req_…`: the provider's ids are a type prefix and a random base62 tail. */
export function newId(prefix: string, length = 24): string {
  return `${prefix}_${randomToken(length)}`;
}

export function unixSeconds(date = new Date()): number {
  return Math.floor(date.getTime() / 1000);
}
