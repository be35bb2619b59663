/**
 * What the payment fake's tests share: a fake per test in a temp folder, the official SDK pointed at
 * it, and a stand-in for the app's webhook endpoint that keeps each signed delivery.
 */
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterEach, beforeEach } from 'vitest';
import { startStripeFake, type StripeFake, type StripeFakeOptions } from '../../../fakes/stripe/server';
import { makeTempDir } from './temp-dir';

export interface Delivery {
  body: string;
  signature: string;
}

/** Registers the per-test set-up and clean-up; call at the top of a test file. */
export function stripeFakeHarness(key: string) {
  let temp: Awaited<ReturnType<typeof makeTempDir>> | undefined;
  let current: StripeFake | undefined;
  let stopReceiver: (() => Promise<void>) | undefined;

  beforeEach(async () => {
    temp = await makeTempDir();
  });

  afterEach(async () => {
    await current?.stop();
    current = undefined;
    await stopReceiver?.();
    stopReceiver = undefined;
    await temp?.remove();
  });

  const fake = (): StripeFake => {
    if (!current) throw new Error('the payment fake is not started in this test');
    return current;
  };

  return {
    fake,
    /** Starts (or, after a stop, restarts on the same state folder) the fake. */
    async start(options: Partial<StripeFakeOptions> = {}): Promise<StripeFake> {
      current = await startStripeFake({ port: 0, dir: temp!.dir, ...options });
      return current;
    },
    sdk(secretKey = key): Stripe {
      return new Stripe(secretKey, { host: '127.0.0.1', port: fake().port, protocol: 'http', maxNetworkRetries: 0 });
    },
    /** A webhook endpoint that answers 500 to the first `failures` deliveries and 200 after. */
    async startReceiver(failures = 0): Promise<{ url: string; deliveries: Delivery[] }> {
      const deliveries: Delivery[] = [];
      const server = createServer(async (request, response) => {
        const chunks: Buffer[] = [];
        for await (const chunk of request) chunks.push(chunk as Buffer);
        deliveries.push({ body: Buffer.concat(chunks).toString('utf8'), signature: String(request.headers['stripe-signature']) });
        response.writeHead(deliveries.length <= failures ? 500 : 200).end();
      });
      await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
      stopReceiver = () => new Promise((resolve) => server.close(() => resolve()));
      return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/webhooks/stripe`, deliveries };
    },
  };
}

export async function waitFor(condition: () => boolean | Promise<boolean>, timeoutMs = 5_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await condition())) {
    if (Date.now() > deadline) throw new Error('timed out waiting');
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}
