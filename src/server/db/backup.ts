/**
 * Online backup and restore of the embedded libSQL file.
 *
 * A backup is one `VACUUM INTO` statement: it reads a single snapshot (a WAL read transaction), so the copy
 * holds exactly the transactions committed before it started and the app keeps writing meanwhile. The copy
 * is written under a temporary name, checked with `PRAGMA integrity_check`, and only then linked into place.
 * A restore checks the backup first, refuses while another process has the database open, and swaps the
 * file in with a rename in the same folder, so the database is either the old one or the restored one.
 */
import { createClient, LibsqlError } from '@libsql/client';
import { randomBytes } from 'node:crypto';
import { existsSync } from 'node:fs';
import { copyFile, link, mkdir, open, rename, rm, stat } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { filePath } from './client';

/** A refusal or failure whose message is meant for the person at the command line. */
export class BackupError extends Error {
  constructor(
    message: string,
    /** 1: the operation failed or was refused; 2: it does not apply (a libSQL server, wrong arguments). */
    readonly exitCode: 1 | 2 = 1,
  ) {
    super(message);
    this.name = 'BackupError';
  }
}

export interface BackupResult {
  source: string;
  file: string;
  bytes: number;
  ms: number;
}

export interface DatabaseCheck {
  /** Migrations recorded in the file: a Lightyard database has at least one. */
  migrations: number;
}

const SIDE_FILES = ['-wal', '-shm', '-journal'];

function embeddedFile(url: string): string {
  const path = filePath(url);
  if (path === null) {
    const server = new URL(url);
    throw new BackupError(
      `DATABASE_URL points at a libSQL server (${server.protocol}//${server.host}), not a file: back it up and restore it with the server's own tools (for Turso, its point-in-time restore; for sqld, its snapshots).`,
      2,
    );
  }
  return resolve(path);
}

/** `20261201T180102123Z`: sorts by time, safe in file names. */
function stamp(date: Date): string {
  return date.toISOString().replace(/[-:.]/g, '');
}

export function defaultBackupPath(now = new Date()): string {
  return resolve('data/backups', `lightyard-${stamp(now)}.db`);
}

/** A name in the target's own folder, so that the final link or rename never crosses file systems. */
function temporaryBeside(target: string, purpose: string): string {
  return join(dirname(target), `.${basename(target)}.${purpose}-${process.pid}-${randomBytes(4).toString('hex')}`);
}

async function fsync(path: string): Promise<void> {
  const handle = await open(path, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

/** Runs `PRAGMA integrity_check` and counts the migrations; throws a BackupError unless the file is a sound Lightyard database. */
export async function checkDatabase(path: string): Promise<DatabaseCheck> {
  if (!existsSync(path)) throw new BackupError(`No file at ${path}.`);
  const client = createClient({ url: `file:${path}` });
  try {
    const problems = (await client.execute('PRAGMA integrity_check')).rows.map((r) => String(r[0])).filter((line) => line !== 'ok');
    if (problems.length) throw new BackupError(`${path} fails its integrity check: ${problems.slice(0, 5).join('; ')}`);
    const tables = await client.execute("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = '__drizzle_migrations'");
    if (!tables.rows.length) throw new BackupError(`${path} is a SQLite database, but not a Lightyard one (it has no migrations table).`);
    const [row] = (await client.execute('SELECT count(*) AS n FROM __drizzle_migrations')).rows;
    return { migrations: Number(row?.n ?? 0) };
  } catch (err) {
    if (err instanceof LibsqlError && (err.code === 'SQLITE_NOTADB' || err.code === 'SQLITE_CORRUPT')) {
      throw new BackupError(`${path} is not a sound database file (${err.code}).`);
    }
    throw err;
  } finally {
    client.close();
  }
}

/** Copies the live database to `to` (default data/backups/lightyard-<timestamp>.db) without stopping the app. */
export async function backupDatabase(opts: { url: string; to?: string }): Promise<BackupResult> {
  const source = embeddedFile(opts.url);
  if (!existsSync(source)) throw new BackupError(`No database at ${source}.`);
  const file = resolve(opts.to ?? defaultBackupPath());
  if (existsSync(file)) throw new BackupError(`${file} already exists; name another file.`);
  await mkdir(dirname(file), { recursive: true });
  const partial = temporaryBeside(file, 'partial');
  const started = Date.now();
  try {
    const client = createClient({ url: `file:${source}`, timeout: 5000 });
    try {
      await client.execute({ sql: 'VACUUM INTO ?', args: [partial] });
    } finally {
      client.close();
    }
    await checkDatabase(partial);
    await fsync(partial);
    // link() fails if the name was taken meanwhile, where rename() would silently replace another backup.
    await link(partial, file).catch((err: NodeJS.ErrnoException) => {
      throw err.code === 'EEXIST' ? new BackupError(`${file} already exists; name another file.`) : err;
    });
    await fsync(dirname(file));
  } finally {
    await rm(partial, { force: true });
  }
  return { source, file, bytes: (await stat(file)).size, ms: Date.now() - started };
}

/**
 * Whether another process has the file open. Every connection to a WAL database keeps a shared lock on it,
 * and leaving WAL mode needs the file to itself, so the switch fails with SQLITE_BUSY exactly then. When it
 * succeeds it checkpoints the WAL into the file, which is about to be replaced anyway.
 */
async function ensureNotInUse(file: string): Promise<void> {
  const client = createClient({ url: `file:${file}` });
  try {
    await client.execute('PRAGMA journal_mode = DELETE');
  } catch (err) {
    if (err instanceof LibsqlError && err.code === 'SQLITE_BUSY') {
      throw new BackupError(
        `${file} is open in another process (is the app running?). Stop it first, or pass --force to replace the file anyway.`,
      );
    }
    throw err;
  } finally {
    client.close();
  }
}

/** Replaces the database file with a checked backup; the old file's -wal, -shm and -journal go too, so none is replayed onto the new one. */
export async function restoreDatabase(opts: { url: string; from: string; force?: boolean }): Promise<DatabaseCheck & { file: string }> {
  const file = embeddedFile(opts.url);
  const from = resolve(opts.from);
  const check = await checkDatabase(from);
  if (!opts.force && existsSync(file)) await ensureNotInUse(file);
  await mkdir(dirname(file), { recursive: true });
  const incoming = temporaryBeside(file, 'restore');
  try {
    await copyFile(from, incoming);
    await fsync(incoming);
    for (const suffix of SIDE_FILES) await rm(file + suffix, { force: true });
    await rename(incoming, file);
    await fsync(dirname(file));
  } finally {
    await rm(incoming, { force: true });
  }
  return { file, ...check };
}
