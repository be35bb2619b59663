import { createHash } from 'node:crypto';
import { idempotencyEndpointMismatch, idempotencyInProgress, idempotencyParametersMismatch } from './errors';
import type { StateStore, StoredResponse } from './state';

// The provider forgets keys after 24 hours, after which a key may be reused for anything.
const KEY_LIFETIME_MS = 24 * 60 * 60 * 1000;

export interface IdempotentRequest {
  /** The connected account (`Stripe-Account`) the request acts for, or '' for the platform. */
  account: string;
  key: string;
  path: string;
  rawBody: string;
}

export type IdempotencyOutcome =
  | { kind: 'replay'; response: StoredResponse }
  | { kind: 'fresh'; finish(response: StoredResponse): void; abandon(): void };

function bodyHash(rawBody: string): string {
  return createHash('sha256').update(rawBody).digest('hex');
}

/**
 * Idempotency-Key handling for POST requests (the only ones the provider applies keys to).
 * Same key and same body: the stored response. Same key, other body or endpoint: the provider's
 * idempotency_error. Keys are scoped per account, as the provider scopes them.
 */
export class IdempotencyKeys {
  private readonly inFlight = new Set<string>();

  constructor(private readonly state: StateStore) {}

  begin(request: IdempotentRequest, nowMs = Date.now()): IdempotencyOutcome {
    const slot = `${request.account}\u0000${request.key}`;
    const records = this.state.idempotency;
    this.forgetExpired(nowMs);

    if (this.inFlight.has(slot)) throw idempotencyInProgress(request.key);
    const record = records[slot];
    if (record) {
      if (record.path !== request.path) {
        throw idempotencyEndpointMismatch(request.key, record.path, request.path);
      }
      if (record.bodyHash !== bodyHash(request.rawBody)) {
        throw idempotencyParametersMismatch(request.key);
      }
      return { kind: 'replay', response: record.response };
    }

    this.inFlight.add(slot);
    return {
      kind: 'fresh',
      finish: (response) => {
        this.inFlight.delete(slot);
        records[slot] = {
          path: request.path,
          bodyHash: bodyHash(request.rawBody),
          createdAtMs: nowMs,
          response,
        };
      },
      abandon: () => {
        this.inFlight.delete(slot);
      },
    };
  }

  private forgetExpired(nowMs: number): void {
    const records = this.state.idempotency;
    for (const [slot, record] of Object.entries(records)) {
      if (nowMs - record.createdAtMs > KEY_LIFETIME_MS) delete records[slot];
    }
  }
}
