import { createHmac } from 'node:crypto';
import { unixSeconds } from './ids';

export interface WebhookEndpoint {
  url: string;
  /** The endpoint's signing secret (`whsec_...`), shared with the app that verifies deliveries. */
  secret: string;
}

// The provider retries for days; locally a few minutes of doubling covers an app restart.
export const DEFAULT_RETRY_DELAYS_MS: readonly number[] = Array.from({ length: 8 }, (_, attempt) =>
  Math.min(1_000 * 2 ** attempt, 120_000),
);
const ATTEMPT_TIMEOUT_MS = 10_000;

/** `t=<unix>,v1=<hex HMAC-SHA256(secret, "<t>.<payload>")>`, the provider's Stripe-Signature. */
export function webhookSignatureHeader(secret: string, payload: string, timestamp = unixSeconds()): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`).digest('hex');
  return `t=${timestamp},v1=${signature}`;
}

/** POSTs payloads to one endpoint, retrying with backoff until it answers 2xx or the delays run out. */
export class WebhookDispatcher {
  private readonly pendingRetries = new Set<NodeJS.Timeout>();
  private readonly stopping = new AbortController();

  constructor(
    private readonly endpoint: WebhookEndpoint,
    private readonly retryDelaysMs: readonly number[] = DEFAULT_RETRY_DELAYS_MS,
  ) {}

  deliver(payload: string, onDelivered: () => void): void {
    void this.attempt(payload, 0, onDelivered);
  }

  stop(): void {
    this.stopping.abort();
    for (const timer of this.pendingRetries) clearTimeout(timer);
    this.pendingRetries.clear();
  }

  private async attempt(payload: string, attempt: number, onDelivered: () => void): Promise<void> {
    if (this.stopping.signal.aborted) return;
    if (await this.post(payload)) {
      onDelivered();
      return;
    }
    const delay = this.retryDelaysMs[attempt];
    if (delay === undefined || this.stopping.signal.aborted) return;
    const timer = setTimeout(() => {
      this.pendingRetries.delete(timer);
      void this.attempt(payload, attempt + 1, onDelivered);
    }, delay);
    this.pendingRetries.add(timer);
  }

  private async post(payload: string): Promise<boolean> {
    try {
      const response = await fetch(this.endpoint.url, {
        method: 'POST',
        headers: {
          'Content-Type': 'application/json; charset=utf-8',
          'User-Agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)',
          // Signed per attempt: a retry carries a fresh timestamp, as the provider's do.
          'Stripe-Signature': webhookSignatureHeader(this.endpoint.secret, payload),
        },
        body: payload,
        signal: AbortSignal.any([this.stopping.signal, AbortSignal.timeout(ATTEMPT_TIMEOUT_MS)]),
      });
      await response.body?.cancel();
      return response.ok;
    } catch {
      // Refused connections and timeouts count as failed attempts, like a non-2xx answer.
      return false;
    }
  }
}
