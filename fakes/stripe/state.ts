import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** Any API object as the provider returns it: at least `id` and `object` (its type). */
export interface StripeObject {
  id: string;
  object: string;
  created?: number;
  [field: string]: unknown;
}

export interface StoredResponse {
  status: number;
  body: unknown;
  requestId: string;
}

export interface IdempotencyRecord {
  path: string;
  bodyHash: string;
  createdAtMs: number;
  response: StoredResponse;
}

/** What the provider keeps about a Checkout Session without returning it on the session. */
export interface SessionExtras {
  lineItems: StripeObject[];
  /** `payment_intent_data` from the create call, applied when the PaymentIntent is made. */
  paymentIntentData: { metadata: Record<string, string>; transferGroup: string | null; description: string | null };
}

export interface AccountLinkRecord {
  account: string;
  refreshUrl: string;
  returnUrl: string;
  /** Unix seconds, as on the account_link object. */
  expiresAt: number;
  used: boolean;
}

export type JobKind = 'expire_checkout_session' | 'settle_payout';

export interface ScheduledJob {
  kind: JobKind;
  objectId: string;
  /** The connected account the object lives on, or '' for the platform. */
  account: string;
  dueAtMs: number;
}

/** Objects by type (`event`, `checkout.session`, ...), then by id, in insertion order. */
type Objects = Record<string, Record<string, StripeObject>>;

interface StateFile {
  version: 1;
  /** The platform's objects. */
  objects: Objects;
  /** Objects that live on a connected account (its payouts, balance transactions, events), by account id. */
  connected: Record<string, Objects>;
  idempotency: Record<string, IdempotencyRecord>;
  checkoutSessions: Record<string, SessionExtras>;
  /** Onboarding links by the token in their URL. */
  accountLinks: Record<string, AccountLinkRecord>;
  /** Timers that must survive a restart (session expiry, payout arrival), by job key. */
  jobs: Record<string, ScheduledJob>;
}

function emptyState(): StateFile {
  return { version: 1, objects: {}, connected: {}, idempotency: {}, checkoutSessions: {}, accountLinks: {}, jobs: {} };
}

function readStateFile(file: string): StateFile {
  if (!existsSync(file)) return emptyState();
  const parsed: unknown = JSON.parse(readFileSync(file, 'utf8'));
  if (typeof parsed !== 'object' || parsed === null || (parsed as { version?: unknown }).version !== 1) {
    // Refuse rather than start empty: silently dropping a developer's orders would be worse.
    throw new Error(`${file} is not a payments fake state file (version 1); move it away to start afresh`);
  }
  // Files written before a section existed are still version 1: the missing sections start empty.
  return { ...emptyState(), ...(parsed as Partial<StateFile>) };
}

/**
 * The fake's whole state, in memory and in one JSON file. Objects handed out are the stored ones:
 * change them in place, then `save()`. `account` is '' for the platform, or the connected account
 * (`Stripe-Account`) an object belongs to.
 */
export class StateStore {
  private constructor(
    private readonly file: string,
    private readonly data: StateFile,
  ) {}

  static open(file: string): StateStore {
    mkdirSync(path.dirname(file), { recursive: true });
    return new StateStore(file, readStateFile(file));
  }

  insert<T extends StripeObject>(object: T, account = ''): T {
    const byId = (this.objectsOf(account)[object.object] ??= {});
    byId[object.id] = object;
    return object;
  }

  get<T extends StripeObject = StripeObject>(type: string, id: string, account = ''): T | undefined {
    return this.objectsOf(account)[type]?.[id] as T | undefined;
  }

  /** Newest first, the order of the provider's list endpoints. */
  list<T extends StripeObject = StripeObject>(type: string, account = ''): T[] {
    return Object.values(this.objectsOf(account)[type] ?? {}).reverse() as T[];
  }

  get idempotency(): Record<string, IdempotencyRecord> {
    return this.data.idempotency;
  }

  get checkoutSessions(): Record<string, SessionExtras> {
    return this.data.checkoutSessions;
  }

  get accountLinks(): Record<string, AccountLinkRecord> {
    return this.data.accountLinks;
  }

  get jobs(): Record<string, ScheduledJob> {
    return this.data.jobs;
  }

  /**
   * Written synchronously so that no request can interleave with a half-written snapshot;
   * the rename makes a crash leave either the old file or the new one.
   */
  save(): void {
    const temp = `${this.file}.tmp`;
    writeFileSync(temp, `${JSON.stringify(this.data, null, 2)}\n`);
    renameSync(temp, this.file);
  }

  private objectsOf(account: string): Objects {
    if (account === '') return this.data.objects;
    return (this.data.connected[account] ??= {});
  }
}
