import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { createClient, LibsqlError, type Client, type InStatement, type Transaction } from '@libsql/client';
import { drizzle, type LibSQLDatabase } from 'drizzle-orm/libsql';
import { getConfig } from '../config';
import * as schema from './schema';

export type Db = LibSQLDatabase<typeof schema>;

let client: Client | undefined;
let db: Db | undefined;
let ready: Promise<void> | undefined;

/** The path of an embedded database (`file:` URL), or null for a libSQL server. */
export function filePath(url: string): string | null {
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
  const opened = createClient({ url: DATABASE_URL, authToken: DATABASE_AUTH_TOKEN, timeout: BUSY_TIMEOUT_MS });
  client = path ? takingTurns(opened) : opened;
  return client;
}

const BUSY_TIMEOUT_MS = 5000;

/**
 * The embedded driver waits for a locked database synchronously, which blocks the event loop: a write
 * started while another pooled connection of this same process holds an open transaction can never see
 * that transaction commit, so the whole process stalls for the busy timeout and the write fails
 * (SQLITE_BUSY, a 503). Within one process, transactions and writes therefore take turns; reads never
 * wait (WAL lets them read the last commit). Waiting longer than the busy timeout fails the same way.
 */
function takingTurns(inner: Client): Client {
  let tail: Promise<void> = Promise.resolve();
  async function turn(): Promise<() => void> {
    const before = tail;
    let release!: () => void;
    tail = new Promise<void>((r) => (release = r));
    let timer: ReturnType<typeof setTimeout> | undefined;
    const waited = await Promise.race([
      before.then(() => 'ready' as const),
      new Promise<'late'>((r) => (timer = setTimeout(() => r('late'), BUSY_TIMEOUT_MS))),
    ]);
    clearTimeout(timer);
    if (waited === 'late') {
      // give the place in the queue up only when it comes, so those behind still follow in order
      void before.then(release);
      throw new LibsqlError('SQLITE_BUSY: database is locked (this process has a transaction open)', 'SQLITE_BUSY');
    }
    let done = false;
    return () => {
      if (!done) release();
      done = true;
    };
  }
  async function inTurn<T>(run: () => Promise<T>): Promise<T> {
    const release = await turn();
    try {
      return await run();
    } finally {
      release();
    }
  }
  const isRead = (stmt: InStatement) => /^\s*select\b/i.test(typeof stmt === 'string' ? stmt : stmt.sql);
  const endsTurn = (tx: Transaction, release: () => void): Transaction =>
    new Proxy(tx, {
      get(target, prop) {
        const value = Reflect.get(target, prop, target) as unknown;
        if (typeof value !== 'function') return value;
        if (prop === 'commit' || prop === 'rollback' || prop === 'close') {
          return async (...args: unknown[]) => {
            try {
              return await (value as (...a: unknown[]) => unknown).apply(target, args);
            } finally {
              release();
            }
          };
        }
        return (value as (...a: unknown[]) => unknown).bind(target);
      },
    });
  return new Proxy(inner, {
    get(target, prop) {
      const value = Reflect.get(target, prop, target) as unknown;
      if (typeof value !== 'function') return value;
      const call = (...args: unknown[]) => (value as (...a: unknown[]) => Promise<unknown>).apply(target, args);
      if (prop === 'execute') return (...args: unknown[]) => (isRead(args[0] as InStatement) ? call(...args) : inTurn(() => call(...args)));
      if (prop === 'batch' || prop === 'migrate' || prop === 'executeMultiple') return (...args: unknown[]) => inTurn(() => call(...args));
      if (prop === 'transaction') {
        return async (...args: unknown[]) => {
          if (args[0] === 'read') return call(...args);
          const release = await turn();
          try {
            return endsTurn((await call(...args)) as Transaction, release);
          } catch (e) {
            release();
            throw e;
          }
        };
      }
      return call;
    },
  });
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
