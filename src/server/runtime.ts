import { getConfig } from './config';
import { migrateDatabase } from './db/migrate';
import { kickOutbox } from './email/outbox';
import { startPaymentJobs } from './payments/jobs';

let ready: Promise<void> | undefined;

/** Once per process, at its first request: apply migrations (a no-op when current), then start the background work. */
export function ensureRuntime(): Promise<void> {
  ready ??= (async () => {
    await migrateDatabase();
    kickOutbox();
    startPaymentJobs(getConfig().JOBS_INTERVAL_MS);
  })();
  return ready;
}
