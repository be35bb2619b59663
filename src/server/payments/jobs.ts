import { receiveOverdue } from './orders';
import { reconcileCheckouts } from './webhooks';

let timer: ReturnType<typeof setInterval> | undefined;
let running = false;

/** Every minute: expire held stock past its reservation (asking the provider first) and close inspection windows. */
async function tick() {
  if (running) return;
  running = true;
  try {
    await reconcileCheckouts();
    await receiveOverdue();
  } catch (err) {
    console.error('[payments jobs]', err);
  } finally {
    running = false;
  }
}

export function startPaymentJobs(intervalMs = 60_000): void {
  if (timer) return;
  timer = setInterval(tick, intervalMs);
  timer.unref();
  setTimeout(tick, 1000).unref();
}
