import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';

export interface ReceivedMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

/** Everything the SMTP fake wrote into its folder, oldest first. */
export async function readMailbox(dir: string): Promise<ReceivedMail[]> {
  let names: string[] = [];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith('.json')).sort();
  } catch {
    return [];
  }
  return Promise.all(names.map(async (n) => JSON.parse(await readFile(join(dir, n), 'utf8')) as ReceivedMail));
}

export async function mailTo(dir: string, to: string): Promise<ReceivedMail[]> {
  return (await readMailbox(dir)).filter((m) => m.to.includes(to.toLowerCase()));
}

/** Polls the folder until a message to `to` matching `subject` arrives. */
export async function waitForMail(dir: string, to: string, subject: RegExp, timeoutMs = 10_000): Promise<ReceivedMail> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const found = (await mailTo(dir, to)).find((m) => subject.test(m.subject));
    if (found) return found;
    if (Date.now() > until) throw new Error(`No mail to ${to} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export function linkIn(mail: ReceivedMail, path: string): string {
  const m = mail.text.match(new RegExp(`https?://\\S+${path.replace(/[/?]/g, '\\$&')}\\S*`));
  if (!m) throw new Error(`No ${path} link in mail "${mail.subject}"`);
  return m[0];
}
