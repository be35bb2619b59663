import path from 'node:path';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { Scheduler } from '../../../fakes/stripe/scheduler';
import { StateStore, type ScheduledJob } from '../../../fakes/stripe/state';
import { makeTempDir } from '../../integration/fakes/temp-dir';

let temp: Awaited<ReturnType<typeof makeTempDir>>;
let file: string;
let scheduler: Scheduler | undefined;

beforeEach(async () => {
  temp = await makeTempDir();
  file = path.join(temp.dir, 'state.json');
});

afterEach(async () => {
  scheduler?.stop();
  scheduler = undefined;
  await temp.remove();
});

function recording(state: StateStore): { scheduler: Scheduler; ran: string[] } {
  const ran: string[] = [];
  const created = new Scheduler(state);
  const record = (job: ScheduledJob) => ran.push(`${job.kind}:${job.objectId}`);
  created.on('expire_checkout_session', record);
  created.on('settle_payout', record);
  scheduler = created;
  return { scheduler: created, ran };
}

describe('payments fake: scheduled jobs', () => {
  test('runs a job when it falls due, once, and forgets it', async () => {
    const state = StateStore.open(file);
    const { scheduler: jobs, ran } = recording(state);
    jobs.start();
    jobs.schedule('settle_payout', 'po_1', 'acct_1', Date.now() + 30);
    expect(ran).toEqual([]);
    await new Promise((resolve) => setTimeout(resolve, 80));
    expect(ran).toEqual(['settle_payout:po_1']);
    expect(state.jobs).toEqual({});
  });

  test('a cancelled job never runs', async () => {
    const { scheduler: jobs, ran } = recording(StateStore.open(file));
    jobs.start();
    jobs.schedule('expire_checkout_session', 'cs_test_1', '', Date.now() + 20);
    jobs.cancel('expire_checkout_session', 'cs_test_1', '');
    await new Promise((resolve) => setTimeout(resolve, 60));
    expect(ran).toEqual([]);
  });

  test('jobs survive in the state file; on start the overdue ones run at once, oldest first', () => {
    const before = StateStore.open(file);
    const now = Date.now();
    const first = new Scheduler(before);
    first.schedule('settle_payout', 'po_late', 'acct_1', now - 1_000);
    first.schedule('expire_checkout_session', 'cs_test_later', '', now + 60_000);
    first.schedule('expire_checkout_session', 'cs_test_older', '', now - 5_000);
    before.save();

    const after = StateStore.open(file);
    const { scheduler: jobs, ran } = recording(after);
    jobs.start(now);
    expect(ran).toEqual(['expire_checkout_session:cs_test_older', 'settle_payout:po_late']);
    expect(Object.values(after.jobs).map((job) => job.objectId)).toEqual(['cs_test_later']);
    expect(Object.values(StateStore.open(file).jobs)).toHaveLength(1);
  });
});
