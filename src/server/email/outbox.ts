import { and, asc, eq, lte } from 'drizzle-orm';
import { getConfig } from '../config';
import { getDb, type Db } from '../db/client';
import { mailOutbox } from '../db/schema';
import { newId } from '../auth/tokens';
import { getTransport } from './transport';

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

const LEASE_MS = 60_000;
const MAX_ATTEMPTS = 12;

/** Backoff between attempts: MAIL_RETRY_BASE_MS (5 s), then doubling: 10 s, 20 s … capped at 10 minutes. */
function backoffMs(attempts: number): number {
  return Math.min(getConfig().MAIL_RETRY_BASE_MS * 2 ** Math.max(0, attempts - 1), 600_000);
}

/**
 * Writes the mail to the outbox (inside the caller's transaction when one is given) and returns its id.
 * Delivery happens after commit, from the outbox, so a relay outage never loses a message.
 */
export async function queueMail(mail: Mail, tx: Pick<Db, 'insert'> = getDb()): Promise<string> {
  const id = newId();
  await tx.insert(mailOutbox).values({ id, ...mail, html: mail.html ?? null, nextAttemptAt: Date.now() });
  return id;
}

/** Claims one due message with a lease, so several app instances never send the same message twice at once. */
async function claim(id: string, now: number): Promise<boolean> {
  const rows = await getDb()
    .update(mailOutbox)
    .set({ nextAttemptAt: now + LEASE_MS })
    .where(and(eq(mailOutbox.id, id), eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, now)))
    .returning({ id: mailOutbox.id });
  return rows.length === 1;
}

export async function deliverDue(limit = 20): Promise<{ sent: number; failed: number }> {
  const db = getDb();
  const now = Date.now();
  const due = await db
    .select()
    .from(mailOutbox)
    .where(and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, now)))
    .orderBy(asc(mailOutbox.createdAt))
    .limit(limit);
  let sent = 0;
  let failed = 0;
  for (const m of due) {
    if (!(await claim(m.id, now))) continue;
    try {
      await getTransport().sendMail({
        from: getConfig().MAIL_FROM,
        to: m.to,
        subject: m.subject,
        text: m.text,
        html: m.html ?? undefined,
        messageId: `<${m.id}@lightyard.example>`,
      });
      await db
        .update(mailOutbox)
        .set({ status: 'sent', sentAt: new Date(), attempts: m.attempts + 1 })
        .where(eq(mailOutbox.id, m.id));
      sent++;
    } catch (err) {
      const attempts = m.attempts + 1;
      await db
        .update(mailOutbox)
        .set({
          attempts,
          lastError: String((err as Error).message ?? err).slice(0, 500),
          status: attempts >= MAX_ATTEMPTS ? 'failed' : 'pending',
          nextAttemptAt: Date.now() + backoffMs(attempts),
        })
        .where(eq(mailOutbox.id, m.id));
      failed++;
    }
  }
  return { sent, failed };
}

let timer: ReturnType<typeof setInterval> | undefined;
let running = false;

async function tick() {
  if (running) return;
  running = true;
  try {
    await deliverDue();
  } catch (err) {
    console.error('[outbox]', err);
  } finally {
    running = false;
  }
}

/** Delivers soon after a mail is queued, and every few seconds after that for anything waiting. */
export function kickOutbox(): void {
  setTimeout(tick, 0);
  if (!timer) {
    timer = setInterval(tick, 3_000);
    timer.unref();
  }
}
