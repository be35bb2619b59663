import path from 'node:path';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { StripeFakeError } from '../../../fakes/stripe/errors';
import { IdempotencyKeys, type IdempotentRequest } from '../../../fakes/stripe/idempotency';
import { StateStore } from '../../../fakes/stripe/state';
import { makeTempDir } from '../../integration/fakes/temp-dir';

let temp: Awaited<ReturnType<typeof makeTempDir>>;
let file: string;

beforeEach(async () => {
  temp = await makeTempDir();
  file = path.join(temp.dir, 'state.json');
});

afterEach(() => temp.remove());

const request: IdempotentRequest = { account: '', key: 'k', path: '/v1/refunds', rawBody: 'payment_intent=pi_1' };
const response = { status: 200, body: { id: 're_1' }, requestId: 'req_1' };

function thrown(run: () => unknown): StripeFakeError {
  try {
    run();
  } catch (error) {
    if (error instanceof StripeFakeError) return error;
    throw error;
  }
  throw new Error('expected a StripeFakeError');
}

describe('payments fake: idempotency keys', () => {
  test('replays a finished request, also after the state is reopened from disk', () => {
    const state = StateStore.open(file);
    const first = new IdempotencyKeys(state).begin(request);
    if (first.kind !== 'fresh') throw new Error('expected a fresh request');
    first.finish(response);
    state.save();

    expect(new IdempotencyKeys(StateStore.open(file)).begin(request)).toEqual({ kind: 'replay', response });
  });

  test('refuses the key on another endpoint, and while the first request is still running', () => {
    const keys = new IdempotencyKeys(StateStore.open(file));
    const running = keys.begin(request);
    expect(thrown(() => keys.begin(request)).status).toBe(409);
    if (running.kind !== 'fresh') throw new Error('expected a fresh request');
    running.finish(response);

    const elsewhere = thrown(() => keys.begin({ ...request, path: '/v1/payouts' }));
    expect(elsewhere.body.type).toBe('idempotency_error');
    expect(elsewhere.body.message).toContain("('/v1/refunds' vs '/v1/payouts')");
  });

  test('scopes keys per connected account and forgets them after 24 hours', () => {
    const keys = new IdempotencyKeys(StateStore.open(file));
    const now = Date.now();
    const first = keys.begin(request, now);
    if (first.kind !== 'fresh') throw new Error('expected a fresh request');
    first.finish(response);

    expect(keys.begin({ ...request, account: 'acct_1', rawBody: 'other' }, now).kind).toBe('fresh');
    expect(keys.begin({ ...request, rawBody: 'other' }, now + 25 * 60 * 60 * 1000).kind).toBe('fresh');
  });

  test('an abandoned request leaves the key free', () => {
    const keys = new IdempotencyKeys(StateStore.open(file));
    const first = keys.begin(request);
    if (first.kind !== 'fresh') throw new Error('expected a fresh request');
    first.abandon();
    expect(keys.begin({ ...request, rawBody: 'other' }).kind).toBe('fresh');
  });
});
