import type { APIContext } from 'astro';
import { getConfig } from '../config';

/** The caller's address; behind a trusted proxy, the first X-Forwarded-For entry. */
export function clientAddress(ctx: Pick<APIContext, 'request' | 'clientAddress'>): string {
  if (getConfig().TRUST_PROXY) {
    const forwarded = ctx.request.headers.get('x-forwarded-for')?.split(',')[0]?.trim();
    if (forwarded) return forwarded;
  }
  try {
    return ctx.clientAddress;
  } catch {
    return 'unknown';
  }
}

/** A socket address of this machine's loopback interface (IPv4, IPv6 or IPv4-mapped IPv6). */
export function isLoopbackAddress(address: string): boolean {
  return /^(127\.\d{1,3}\.\d{1,3}\.\d{1,3}|::1|::ffff:127\.\d{1,3}\.\d{1,3}\.\d{1,3})$/i.test(address);
}
