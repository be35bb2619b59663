import { createServer, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import Stripe from 'stripe';
import { expireDueSession, lineItemsList } from './checkout';
import type { StripeFakeContext, StripeFakeSettings } from './context';
import { EventLog } from './events';
import { createRequestHandler, errorResponse, newRequestId, type Reply } from './handle-request';
import { IdempotencyKeys } from './idempotency';
import { createPageHandler } from './pages/handle-page';
import { Router } from './router';
import { addAccountRoutes } from './routes/accounts';
import { addBalanceRoutes } from './routes/balance';
import { addCheckoutSessionRoutes } from './routes/checkout-sessions';
import { addEventRoutes } from './routes/events';
import { addFakeControlRoutes } from './routes/fake-control';
import { addPaymentRoutes } from './routes/payments';
import { addPayoutRoutes, FAILING_PAYOUT_AMOUNT, settlePayout } from './routes/payouts';
import { addRefundRoutes } from './routes/refunds';
import { addTransferRoutes } from './routes/transfers';
import { Scheduler } from './scheduler';
import { StateStore, type StripeObject } from './state';
import { WebhookDispatcher } from './webhooks';

export { FAILING_PAYOUT_AMOUNT } from './routes/payouts';

export interface StripeFakeOptions {
  host?: string;
  port: number;
  /** Holds state.json, which keeps the fake's objects across restarts. */
  dir: string;
  /** Where events are POSTed, signed with `webhookSecret`; without it events are only recorded. */
  webhookUrl?: string;
  webhookSecret?: string;
  /** Waits between delivery attempts; tests shorten them. */
  webhookRetryDelaysMs?: readonly number[];
  /** Origin put into session and onboarding URLs; defaults to http://<host>:<port>. */
  publicUrl?: string;
  /** Country of new connected accounts that name none, and the platform's balance currency (`DE`, `eur`). */
  platformCountry?: string;
  platformCurrency?: string;
  /** How long a charge's money is pending before it is available; 0 (the default) is at once. */
  balanceAvailableAfterMs?: number;
  /** How long a payout is pending before it is paid or fails; 2 s by default. */
  payoutDelayMs?: number;
  /** Whether a payout fails when it falls due; by default those of FAILING_PAYOUT_AMOUNT do. */
  failPayout?: (payout: StripeObject, account: string) => boolean;
}

export interface StripeFake {
  port: number;
  /** The origin hosted pages are served at, as put into session and account link URLs. */
  url: string;
  stop(): Promise<void>;
}

// The SDK pins an API version; objects the fake creates say they were rendered for it.
const DEFAULT_API_VERSION: string = Stripe.API_VERSION;
const DEFAULT_PAYOUT_DELAY_MS = 2_000;

function createRouter(): Router<StripeFakeContext> {
  const router = new Router<StripeFakeContext>();
  addAccountRoutes(router);
  addBalanceRoutes(router);
  addCheckoutSessionRoutes(router);
  addEventRoutes(router);
  addFakeControlRoutes(router);
  addPaymentRoutes(router);
  addPayoutRoutes(router);
  addRefundRoutes(router);
  addTransferRoutes(router);
  return router;
}

function send({ response, headers }: Reply, res: ServerResponse): void {
  const payload = `${JSON.stringify(response.body, null, 2)}\n`;
  res.writeHead(response.status, {
    'Content-Type': 'application/json',
    'Content-Length': Buffer.byteLength(payload),
    'Request-Id': response.requestId,
    ...headers,
  });
  res.end(payload);
}

function originOf(host: string, port: number): string {
  return `http://${host.includes(':') ? `[${host}]` : host}:${port}`;
}

export async function startStripeFake({
  host = '127.0.0.1',
  port,
  dir,
  webhookUrl,
  webhookSecret,
  webhookRetryDelaysMs,
  publicUrl,
  platformCountry = 'DE',
  platformCurrency = 'eur',
  balanceAvailableAfterMs = 0,
  payoutDelayMs = DEFAULT_PAYOUT_DELAY_MS,
  failPayout = (payout) => payout.amount === FAILING_PAYOUT_AMOUNT,
}: StripeFakeOptions): Promise<StripeFake> {
  if (webhookUrl && !webhookSecret) {
    throw new Error('startStripeFake: webhookUrl needs a webhookSecret to sign deliveries with');
  }
  const state = StateStore.open(path.join(dir, 'state.json'));
  const dispatcher =
    webhookUrl && webhookSecret ? new WebhookDispatcher({ url: webhookUrl, secret: webhookSecret }, webhookRetryDelaysMs) : undefined;
  const settings: StripeFakeSettings = {
    publicUrl: publicUrl?.replace(/\/+$/, '') ?? '',
    platformCountry: platformCountry.toUpperCase(),
    platformCurrency: platformCurrency.toLowerCase(),
    balanceAvailableAfterMs,
    payoutDelayMs,
    failPayout,
  };
  const scheduler = new Scheduler(state);
  const context: StripeFakeContext = {
    state,
    events: new EventLog(state, DEFAULT_API_VERSION, dispatcher),
    scheduler,
    settings,
  };
  scheduler.on('expire_checkout_session', (job) => expireDueSession(context, job));
  scheduler.on('settle_payout', (job) => settlePayout(context, job));
  const handle = createRequestHandler(createRouter(), context, new IdempotencyKeys(state), DEFAULT_API_VERSION, {
    'checkout.session.line_items': lineItemsList,
  });
  const handlePage = createPageHandler(context);

  const server = createServer((request, response) => {
    handlePage(request, response)
      .then(async (handled) => {
        if (!handled) send(await handle(request), response);
      })
      // API errors are answered by handle(); what is left is a client that went away mid-body, or a bug in a page.
      .catch((error: unknown) => {
        const reply = { response: errorResponse(error, newRequestId()), headers: {} };
        if (response.headersSent) response.destroy();
        else send(reply, response);
      });
  });

  const address = await new Promise<AddressInfo>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve(server.address() as AddressInfo);
    });
  });
  settings.publicUrl ||= originOf(host, address.port);
  // After listening, so that what fell due while the fake was down is settled before start resolves.
  scheduler.start();
  state.save();

  return {
    port: address.port,
    url: settings.publicUrl,
    async stop() {
      scheduler.stop();
      dispatcher?.stop();
      const closed = new Promise<void>((resolve, reject) => server.close((error) => (error ? reject(error) : resolve())));
      // The SDK keeps connections alive; without this close() waits for them to time out.
      server.closeAllConnections();
      await closed;
      state.save();
    },
  };
}
