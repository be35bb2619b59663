import Stripe from 'stripe';
import { getConfig } from '../config';
import { HttpError } from '../http/errors';

let client: Stripe | undefined;

/** The payment provider's official SDK; with STRIPE_API_BASE it talks to the local fake. */
export function getProvider(): Stripe {
  if (client) return client;
  const c = getConfig();
  const base = c.STRIPE_API_BASE ? new URL(c.STRIPE_API_BASE) : null;
  client = new Stripe(c.STRIPE_SECRET_KEY, {
    ...(base
      ? {
          host: base.hostname,
          port: Number(base.port || (base.protocol === 'https:' ? 443 : 80)),
          protocol: base.protocol.replace(':', '') as 'http' | 'https',
        }
      : {}),
    maxNetworkRetries: 1,
    timeout: 10_000,
  });
  return client;
}

/** A provider that cannot be reached (or answers 5xx) becomes a 503 the UI can retry; its own 4xx stay as they are. */
export function providerUnavailable(err: unknown): HttpError | null {
  const e = err as { type?: string; statusCode?: number };
  if (e?.type === 'StripeConnectionError' || e?.type === 'StripeAPIError' || (e?.statusCode ?? 0) >= 500) {
    return new HttpError(
      503,
      'payment_unavailable',
      'The payment provider is not answering right now. Nothing was charged; try again in a minute.',
      undefined,
      { 'retry-after': '30' },
    );
  }
  return null;
}
