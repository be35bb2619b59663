import { getConfig } from './config';
import { migrateDatabase } from './db/migrate';
import { kickOutbox } from './email/outbox';
import { startPaymentJobs } from './payments/jobs';
import { liveIndex } from './search/service';

let ready: Promise<void> | undefined;

/**
 * Once per process, at its first request: apply migrations (a no-op when current), then start the
 * background work, including building the search index so that the first search does not wait for it.
 */
export function ensureRuntime(): Promise<void> {
  ready ??= (async () => {
    await migrateDatabase();
    kickOutbox();
    startPaymentJobs(getConfig().JOBS_INTERVAL_MS);
    void liveIndex()
      .ensureBuilt()
      .catch((e) => console.error('[search] building the index', e));
  })();
  return ready;
}
