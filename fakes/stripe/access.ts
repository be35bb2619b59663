import { invalidRequest } from './errors';
import type { FakeRequest } from './router';

/**
 * The fake keeps Checkout, charges, refunds, transfers and accounts on the platform only (no
 * direct charges on a connected account); saying so beats quietly acting for the platform.
 */
export function requirePlatform(request: FakeRequest): void {
  if (request.account !== '') {
    throw invalidRequest(
      `The payments fake serves ${request.method} ${request.path} for the platform only; send it without the Stripe-Account header.`,
    );
  }
}

/** The connected account a request must act for (`Stripe-Account`), for endpoints the fake serves only there. */
export function requireConnectedAccount(request: FakeRequest): string {
  if (request.account === '') {
    throw invalidRequest(
      `The payments fake serves ${request.method} ${request.path} for connected accounts only; send the Stripe-Account header.`,
    );
  }
  return request.account;
}
