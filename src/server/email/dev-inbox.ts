import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { getConfig } from '../config';

export interface DeliveredMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
}

/** Reads what the local SMTP fake delivered (newest first); only used when the fakes are configured. */
export async function readDevInbox(limit = 100): Promise<DeliveredMail[]> {
  const dir = getConfig().MAIL_DIR;
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith('.json'));
  } catch {
    return [];
  }
  names.sort().reverse();
  const out: DeliveredMail[] = [];
  for (const n of names.slice(0, limit)) {
    try {
      out.push(JSON.parse(await readFile(join(dir, n), 'utf8')) as DeliveredMail);
    } catch {
      // a message still being written is skipped and shows on the next load
    }
  }
  return out;
}
