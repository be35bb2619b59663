import { newId, unixSeconds } from './ids';
import type { FakeRequest } from './router';
import type { StateStore, StripeObject } from './state';
import type { WebhookDispatcher } from './webhooks';

export interface StripeEvent extends StripeObject {
  object: 'event';
  /** Set on events about a connected account's objects, as the provider sets it for Connect events. */
  account?: string;
  context?: string;
  api_version: string;
  created: number;
  type: string;
  livemode: false;
  pending_webhooks: number;
  data: { object: Record<string, unknown>; previous_attributes?: Record<string, unknown> };
  request: { id: string | null; idempotency_key: string | null };
}

/** The API request that caused an event; null for changes the fake makes on its own or a customer makes on a page. */
export interface EventRequest {
  id: string;
  idempotencyKey: string | null;
}

export function eventRequest(request: FakeRequest): EventRequest {
  return { id: request.requestId, idempotencyKey: request.idempotencyKey };
}

export interface EmitOptions {
  previousAttributes?: Record<string, unknown>;
  request?: EventRequest | null;
  /** The connected account the object belongs to; the event is recorded on that account. */
  account?: string;
}

/** Records events and hands each to the webhook endpoint, when one is configured. */
export class EventLog {
  constructor(
    private readonly state: StateStore,
    private readonly apiVersion: string,
    private readonly dispatcher: WebhookDispatcher | undefined,
  ) {}

  /** `object` is copied as it is now: later changes to it belong to later events. */
  emit(type: string, object: Record<string, unknown>, options: EmitOptions = {}): StripeEvent {
    const account = options.account ?? '';
    const snapshot = structuredClone(object);
    const event = this.state.insert<StripeEvent>(
      {
        id: newId('evt'),
        object: 'event',
        ...(account === '' ? {} : { account, context: account }),
        api_version: this.apiVersion,
        created: unixSeconds(),
        type,
        livemode: false,
        pending_webhooks: this.dispatcher ? 1 : 0,
        data: options.previousAttributes
          ? { object: snapshot, previous_attributes: structuredClone(options.previousAttributes) }
          : { object: snapshot },
        request: {
          id: options.request?.id ?? null,
          idempotency_key: options.request?.idempotencyKey ?? null,
        },
      },
      account,
    );
    this.state.save();
    this.dispatcher?.deliver(JSON.stringify(event, null, 2), () => {
      event.pending_webhooks = 0;
      this.state.save();
    });
    return event;
  }
}
