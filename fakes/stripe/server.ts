import { createServer, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import Stripe from 'stripe';
import type { StripeFakeContext } from './context';
import { EventLog } from './events';
import { createRequestHandler, errorResponse, newRequestId, type Reply } from './handle-request';
import { IdempotencyKeys } from './idempotency';
import { Router } from './router';
import { addBalanceRoutes } from './routes/balance';
import { addEventRoutes } from './routes/events';
import { addFakeControlRoutes } from './routes/fake-control';
import { StateStore } from './state';
import { WebhookDispatcher } from './webhooks';

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
}

export interface StripeFake {
  port: number;
  stop(): Promise<void>;
}

// The SDK pins an API version; objects the fake creates say they were rendered for it.
const DEFAULT_API_VERSION: string = Stripe.API_VERSION;

function createRouter(): Router<StripeFakeContext> {
  const router = new Router<StripeFakeContext>();
  addBalanceRoutes(router);
  addEventRoutes(router);
  addFakeControlRoutes(router);
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

export async function startStripeFake({
  host = '127.0.0.1',
  port,
  dir,
  webhookUrl,
  webhookSecret,
  webhookRetryDelaysMs,
}: StripeFakeOptions): Promise<StripeFake> {
  if (webhookUrl && !webhookSecret) {
    throw new Error('startStripeFake: webhookUrl needs a webhookSecret to sign deliveries with');
  }
  const state = StateStore.open(path.join(dir, 'state.json'));
  const dispatcher =
    webhookUrl && webhookSecret
      ? new WebhookDispatcher({ url: webhookUrl, secret: webhookSecret }, webhookRetryDelaysMs)
      : undefined;
  const context: StripeFakeContext = { state, events: new EventLog(state, DEFAULT_API_VERSION, dispatcher) };
  const handle = createRequestHandler(createRouter(), context, new IdempotencyKeys(state), DEFAULT_API_VERSION);

  const server = createServer((request, response) => {
    handle(request).then(
      (reply) => send(reply, response),
      // Only reading the body can fail here (the client went away); everything else is a Reply.
      (error: unknown) => send({ response: errorResponse(error, newRequestId()), headers: {} }, response),
    );
  });

  const address = await new Promise<AddressInfo>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve(server.address() as AddressInfo);
    });
  });

  return {
    port: address.port,
    async stop() {
      dispatcher?.stop();
      const closed = new Promise<void>((resolve, reject) =>
        server.close((error) => (error ? reject(error) : resolve())),
      );
      // The SDK keeps connections alive; without this close() waits for them to time out.
      server.closeAllConnections();
      await closed;
      state.save();
    },
  };
}
