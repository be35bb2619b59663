import { newId, unixSeconds } from './ids';
import type { StateStore, StripeObject } from './state';
import type { WebhookDispatcher } from './webhooks';

export interface StripeEvent extends StripeObject {
  object: 'event';
  api_version: string;
  created: number;
  type: string;
  livemode: false;
  pending_webhooks: number;
  data: { object: Record<string, unknown>; previous_attributes?: Record<string, unknown> };
  request: { id: string | null; idempotency_key: string | null };
}

export interface EmitOptions {
  previousAttributes?: Record<string, unknown>;
  /** The API request that caused the event; null for changes the fake makes on its own. */
  request?: { id: string; idempotencyKey: string | null };
}

/** Records events and hands each to the webhook endpoint, when one is configured. */
export class EventLog {
  constructor(
    private readonly state: StateStore,
    private readonly apiVersion: string,
    private readonly dispatcher: WebhookDispatcher | undefined,
  ) {}

  emit(type: string, object: Record<string, unknown>, options: EmitOptions = {}): StripeEvent {
    const event = this.state.insert<StripeEvent>({
      id: newId('evt'),
      object: 'event',
      api_version: this.apiVersion,
      created: unixSeconds(),
      type,
      livemode: false,
      pending_webhooks: this.dispatcher ? 1 : 0,
      data: options.previousAttributes
        ? { object, previous_attributes: options.previousAttributes }
        : { object },
      request: {
        id: options.request?.id ?? null,
        idempotency_key: options.request?.idempotencyKey ?? null,
      },
    });
    this.state.save();
    this.dispatcher?.deliver(JSON.stringify(event, null, 2), () => {
      event.pending_webhooks = 0;
      this.state.save();
    });
    return event;
  }
}
