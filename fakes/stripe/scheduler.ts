import type { JobKind, ScheduledJob, StateStore } from './state';

type JobHandler = (job: ScheduledJob) => void;

// setTimeout takes at most a signed 32-bit delay; a longer wait is re-armed in steps.
const MAX_TIMER_MS = 2 ** 31 - 1;

function jobKey(kind: JobKind, account: string, objectId: string): string {
  return `${kind}:${account}:${objectId}`;
}

/**
 * Things the provider does later on its own (a session expiring, a payout arriving), kept in the
 * state file so that a restart runs what fell due while the fake was down, oldest first.
 */
export class Scheduler {
  private readonly timers = new Map<string, NodeJS.Timeout>();
  private readonly handlers = new Map<JobKind, JobHandler>();
  private running = false;

  constructor(private readonly state: StateStore) {}

  on(kind: JobKind, handler: JobHandler): void {
    this.handlers.set(kind, handler);
  }

  schedule(kind: JobKind, objectId: string, account: string, dueAtMs: number): void {
    const key = jobKey(kind, account, objectId);
    this.state.jobs[key] = { kind, objectId, account, dueAtMs };
    if (this.running) this.arm(key);
  }

  cancel(kind: JobKind, objectId: string, account: string): void {
    const key = jobKey(kind, account, objectId);
    delete this.state.jobs[key];
    this.disarm(key);
  }

  /** Runs every job already due, in due order, then arms timers for the rest. */
  start(nowMs = Date.now()): void {
    this.running = true;
    const jobs = Object.entries(this.state.jobs).sort(([, a], [, b]) => a.dueAtMs - b.dueAtMs);
    for (const [key, job] of jobs) {
      if (job.dueAtMs <= nowMs) this.run(key);
      else this.arm(key);
    }
  }

  stop(): void {
    this.running = false;
    for (const timer of this.timers.values()) clearTimeout(timer);
    this.timers.clear();
  }

  private arm(key: string): void {
    this.disarm(key);
    const job = this.state.jobs[key];
    if (!job) return;
    const delay = Math.max(0, job.dueAtMs - Date.now());
    const timer = setTimeout(
      () => {
        this.timers.delete(key);
        if (delay > MAX_TIMER_MS) this.arm(key);
        else this.run(key);
      },
      Math.min(delay, MAX_TIMER_MS),
    );
    this.timers.set(key, timer);
  }

  private disarm(key: string): void {
    const timer = this.timers.get(key);
    if (timer) clearTimeout(timer);
    this.timers.delete(key);
  }

  private run(key: string): void {
    const job = this.state.jobs[key];
    if (!job) return;
    delete this.state.jobs[key];
    try {
      this.handlers.get(job.kind)?.(job);
    } catch (error) {
      // A failing job must not stop the others or the server; it is reported and dropped.
      console.error(`payments fake: scheduled ${job.kind} for ${job.objectId} failed`, error);
    }
    this.state.save();
  }
}
