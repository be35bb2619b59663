/**
 * npm run db:backup / db:restore, run as the scripts a person would run, against a running app that keeps
 * taking orders and listings while the copy is made.
 */
import { createClient, type Client as DbClient } from '@libsql/client';
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';
import { mirrorListing } from '../setup/listing-bodies';

const PASSWORD = 'demo-password-1';
const STOCK = 1000;
const BUYERS = 4;
let app: TestApp;
let work: string;

beforeAll(async () => {
  app = await startTestApp();
  work = mkdtempSync(join(tmpdir(), 'lightyard-backup-'));
});
afterAll(async () => {
  await app?.stop();
  if (work) rmSync(work, { recursive: true, force: true });
});

/** Runs an npm script with DATABASE_URL set, as a person at the command line would. */
function npmRun(script: string, args: string[], databaseUrl: string): Promise<{ code: number | null; out: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn('npm', ['run', '--silent', script, '--', ...args], {
      env: { ...process.env, DATABASE_URL: databaseUrl },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    child.stdout.on('data', (d) => (out += d));
    child.stderr.on('data', (d) => (out += d));
    child.on('error', reject);
    child.on('exit', (code) => resolve({ code, out }));
  });
}

async function withDb<T>(url: string, use: (db: DbClient) => Promise<T>): Promise<T> {
  const db = createClient({ url });
  try {
    return await use(db);
  } finally {
    db.close();
  }
}

const ids = async (db: DbClient, query: string) => new Set((await db.execute(query)).rows.map((r) => String(r.id)));

async function signedIn(origin: string, email: string, password: string): Promise<Client> {
  const c = new Client(origin);
  expect((await c.signIn(email, password)).status).toBe(200);
  return c;
}

const mirror = (title: string, quantity: number) =>
  mirrorListing(title, { quantity, priceCents: 1_000, description: 'Written while the backup runs.' });

async function liveListing(quantity: number): Promise<string> {
  const seller = await signedIn(app.origin, 'seller2@demo.lightyard.example', PASSWORD);
  const { id } = await (await seller.post('/api/listings', mirror('Backup load mirror', quantity))).json();
  await seller.post(`/api/listings/${id}/submit`);
  const mod = await signedIn(app.origin, 'moderator@demo.lightyard.example', PASSWORD);
  expect((await mod.post(`/api/moderation/listings/${id}`, { action: 'approve' })).status).toBe(200);
  return id;
}

interface Acked {
  id: string;
  /** When the app's answer arrived: the write was committed by then. */
  at: number;
}

/** Per buyer, below the 200 orders that GET /api/orders lists. */
const MAX_ORDERS_EACH = 150;

/** Buyers checking out one unit at a time and a seller drafting listings, until told to stop; every write is recorded once acknowledged. */
function writeLoad(buyers: Client[], seller: Client, listingId: string) {
  const orders: (Acked & { buyer: number })[] = [];
  const drafts: Acked[] = [];
  const failures: string[] = [];
  let stopped = false;
  const buyerLoop = async (buyer: Client, index: number) => {
    for (let placed = 0; !stopped && placed < MAX_ORDERS_EACH; placed++) {
      const added = await buyer.post('/api/cart/items', { listingId, quantity: 1 });
      const res = added.status === 201 ? await buyer.post('/api/checkout', {}) : added;
      if (res.status !== 201) failures.push(`${res.status} ${await res.text()}`);
      else for (const id of (await res.json()).orderIds as string[]) orders.push({ id, at: Date.now(), buyer: index });
    }
  };
  const sellerLoop = async () => {
    for (let i = 0; !stopped; i++) {
      const res = await seller.post('/api/listings', mirror(`Draft under load ${i}`, 1));
      if (res.status !== 201) failures.push(`${res.status} ${await res.text()}`);
      else drafts.push({ id: (await res.json()).id, at: Date.now() });
    }
  };
  const running = Promise.all([...buyers.map(buyerLoop), sellerLoop()]);
  return {
    orders,
    drafts,
    failures,
    async stop() {
      stopped = true;
      await running;
    },
  };
}

describe('backup and restore', () => {
  test('a backup taken while orders and listings are being written holds every one committed before it started, and restores into a working app', async () => {
    const listingId = await liveListing(STOCK);
    const { buildUser } = await import('../../src/server/db/factories');
    const accounts = await Promise.all(
      Array.from({ length: BUYERS }, (_, i) =>
        buildUser({ email: `backup.buyer${i}@lab.example`, name: `Backup buyer ${i}`, password: 'backup-password-1' }),
      ),
    );
    const buyers = await Promise.all(accounts.map((a) => signedIn(app.origin, a.email, 'backup-password-1')));
    const seller = await signedIn(app.origin, 'seller2@demo.lightyard.example', PASSWORD);
    const load = writeLoad(buyers, seller, listingId);
    const file = join(work, 'under-load.db');
    let startedAt = 0;
    let endedAt = 0;
    let backup: { code: number | null; out: string };
    try {
      while ((load.orders.length < 40 || load.drafts.length < 10) && !load.failures.length) await new Promise((r) => setTimeout(r, 50));
      startedAt = Date.now();
      backup = await npmRun('db:backup', [file], app.env.DATABASE_URL!);
      endedAt = Date.now();
    } finally {
      await load.stop();
    }
    expect(backup.out).toMatch(/integrity check ok/);
    expect(backup.code).toBe(0);
    // Online: no write was refused or delayed into an error while the copy was made, and writes went on during it.
    expect(load.failures).toEqual([]);
    expect(load.orders.filter((o) => o.at > startedAt && o.at < endedAt).length).toBeGreaterThan(0);
    const committedBefore = (acked: Acked[]) => acked.filter((a) => a.at < startedAt).map((a) => a.id);

    await withDb(`file:${file}`, async (db) => {
      expect((await db.execute('PRAGMA integrity_check')).rows.map((r) => r[0])).toEqual(['ok']);
      expect((await db.execute('PRAGMA foreign_key_check')).rows).toEqual([]);
      const orders = await ids(db, 'SELECT id FROM orders');
      const listings = await ids(db, 'SELECT id FROM listings');
      expect(committedBefore(load.orders).filter((id) => !orders.has(id))).toEqual([]);
      expect(committedBefore(load.drafts).filter((id) => !listings.has(id))).toEqual([]);
      // One snapshot: every unit of stock taken by an order in the copy is missing from the listing in the copy.
      const [stock] = (
        await db.execute({
          sql: 'SELECT l.quantity AS left, (SELECT coalesce(sum(i.quantity), 0) FROM order_items i WHERE i.listing_id = l.id) AS sold FROM listings l WHERE l.id = ?',
          args: [listingId],
        })
      ).rows;
      expect(Number(stock!.left) + Number(stock!.sold)).toBe(STOCK);
    });

    const restoredDir = mkdtempSync(join(tmpdir(), 'lightyard-restored-'));
    const restore = await npmRun('db:restore', [file], `file:${join(restoredDir, 'lightyard.db')}`);
    expect(restore.out).toMatch(/Restored/);
    expect(restore.code).toBe(0);
    const restored = await startTestApp({ dir: restoredDir, seed: false });
    try {
      for (const [i, account] of accounts.entries()) {
        const buyer = await signedIn(restored.origin, account.email, 'backup-password-1');
        const res = await buyer.get('/api/orders');
        expect(res.status).toBe(200);
        const seen = new Set(((await res.json()).orders as { id: string }[]).map((o) => o.id));
        const before = committedBefore(load.orders.filter((o) => o.buyer === i));
        expect(before.length).toBeGreaterThan(0);
        expect(before.filter((id) => !seen.has(id))).toEqual([]);
      }
      const restoredSeller = await signedIn(restored.origin, 'seller2@demo.lightyard.example', PASSWORD);
      expect((await restoredSeller.post('/api/listings', mirror('Listed after the restore', 1))).status).toBe(201);
    } finally {
      await restored.stop();
    }
  }, 60_000);

  test('restore refuses a database the app has open and a file that is not a sound database; a libSQL server URL is sent to its own tools', async () => {
    const backup = join(work, 'for-refusals.db');
    expect((await npmRun('db:backup', [backup], app.env.DATABASE_URL!)).code).toBe(0);
    const buyer = await signedIn(app.origin, 'buyer@demo.lightyard.example', PASSWORD);
    const listingId = await liveListing(5);
    // Written after the backup: a restore that went ahead would lose it.
    expect((await buyer.post('/api/cart/items', { listingId, quantity: 1 })).status).toBe(201);

    const refused = await npmRun('db:restore', [backup], app.env.DATABASE_URL!);
    expect(refused.code).toBe(1);
    expect(refused.out).toMatch(/open in another process .*--force/s);
    const cart = await (await buyer.get('/api/cart')).json();
    expect(cart.items.map((i: { listingId: string }) => i.listingId)).toContain(listingId);
    expect((await buyer.post('/api/cart/items', { listingId, quantity: 2 })).status).toBe(201);

    const junk = join(work, 'junk.db');
    writeFileSync(junk, 'this is not a database\n'.repeat(200));
    const target = join(work, 'never-written', 'lightyard.db');
    const notADatabase = await npmRun('db:restore', [junk], `file:${target}`);
    expect(notADatabase.code).toBe(1);
    expect(notADatabase.out).toMatch(/not a sound database/);
    expect(existsSync(target)).toBe(false);

    for (const script of ['db:backup', 'db:restore']) {
      const server = await npmRun(script, script === 'db:restore' ? [backup] : [], 'libsql://lightyard-example.turso.io');
      expect(server.code).toBe(2);
      expect(server.out).toMatch(/libSQL server .*own tools/);
    }
  }, 60_000);
});
