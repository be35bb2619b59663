import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { createClient, type Client } from '@libsql/client';
import { drizzle, type LibSQLDatabase } from 'drizzle-orm/libsql';
import { getConfig } from '../config';
import * as schema from './schema';

export type Db = LibSQLDatabase<typeof schema>;

let client: Client | undefined;
let db: Db | undefined;
let ready: Promise<void> | undefined;

function filePath(url: string): string | null {
  if (!url.startsWith('file:')) return null;
  return url.slice('file:'.length).replace(/^\/\/(?=\/)/, '');
}

/** The libSQL client: an embedded file, or a libSQL server for several app instances; same code. */
export function getClient(): Client {
  if (client) return client;
  const { DATABASE_URL, DATABASE_AUTH_TOKEN } = getConfig();
  const path = filePath(DATABASE_URL);
  if (path) mkdirSync(dirname(path), { recursive: true });
  // timeout is the per-connection busy timeout (ms): a request waits this long for a writer, then fails cleanly.
  client = createClient({ url: DATABASE_URL, authToken: DATABASE_AUTH_TOKEN, timeout: 5000 });
  return client;
}

export function getDb(): Db {
  db ??= drizzle(getClient(), { schema });
  return db;
}

/** Pragmas for the embedded file: WAL (persistent in the file) and foreign keys, checked rather than assumed. */
export function prepareDatabase(): Promise<void> {
  ready ??= (async () => {
    const c = getClient();
    if (filePath(getConfig().DATABASE_URL)) {
      await c.execute('PRAGMA journal_mode = WAL');
      await c.execute('PRAGMA synchronous = NORMAL');
    }
    await c.execute('PRAGMA foreign_keys = ON');
    const fk = await c.execute('PRAGMA foreign_keys');
    if (Number(fk.rows[0]?.[0]) !== 1) throw new Error('The database refused to enable foreign keys');
  })();
  return ready;
}

export async function closeDb(): Promise<void> {
  client?.close();
  client = undefined;
  db = undefined;
  ready = undefined;
}
