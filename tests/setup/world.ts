/**
 * The people and things the access matrix and the fuzzing act on: one signed-in client per role and
 * real ids from the seeded demo (plus what the API itself creates: a file, an order, a thread…).
 * Everything goes through the API as a browser would, except accounts and memberships the API has no
 * way to make (an unverified user, a spare lab member), which come from the same factories as the seed.
 */
import sharp from 'sharp';
import { Client, type TestApp } from './app';
import { linkIn, waitForMail } from './mailbox';
import { payWithCard, until } from './provider';
import { mirrorListing } from './listing-bodies';

export const ROLES = ['anonymous', 'unverified', 'buyer', 'memberA', 'ownerA', 'ownerB', 'moderator', 'admin'] as const;
export type Role = (typeof ROLES)[number];
export type SignedInRole = Exclude<Role, 'anonymous'>;

export const ROLE_LABELS: Record<Role, string> = {
  anonymous: 'anonymous',
  unverified: 'unverified user',
  buyer: 'buyer',
  memberA: 'member of lab A',
  ownerA: 'owner of lab A',
  ownerB: 'owner of lab B',
  moderator: 'moderator',
  admin: 'admin',
};

const DEMO_PASSWORD = 'demo-password-1';
const demo = (who: string) => ({ email: `${who}@demo.lightyard.example`, password: DEMO_PASSWORD });

const ACCOUNTS: Record<SignedInRole, { email: string; password: string }> = {
  unverified: { email: 'unverified.member@lab.example', password: 'unverified-password-1' },
  buyer: demo('buyer'),
  memberA: demo('member'),
  ownerA: demo('seller'),
  ownerB: demo('seller2'),
  moderator: demo('moderator'),
  admin: demo('admin'),
};

export interface Person {
  id: string;
  email: string;
  password: string;
  name: string;
}

export interface World {
  app: TestApp;
  client: Record<Role, Client>;
  user: Record<SignedInRole, Person>;
  labA: { id: string; slug: string };
  labB: { id: string; slug: string };
  /** Seeded: a live listing of lab A and the one of lab A waiting for review. */
  liveA: string;
  reviewA: string;
  /** Live listings with plenty of units: `stock` of a lab none of the roles belongs to, `stockA` of lab A. */
  stock: string;
  stockA: string;
  /** A draft of lab A that edits land on. */
  draftA: string;
  /** Ready photos: one on a live listing, one on the in-review listing (only insiders may fetch it). */
  fileLive: string;
  fileHidden: string;
  /** The buyer's question about liveA, the buyer's report of it, the buyer's saved search. */
  thread: string;
  report: string;
  savedSearch: string;
  /** A paid order of the buyer from lab A. */
  order: { id: string; sessionId: string };
  /** Lab A's invitation to an address that none of the roles signs in with. */
  inviteToken: string;
  /** A user without any part in the fixtures, whose roles the admin rows change. */
  bystander: string;
  /** Credentials of an account that nobody is signed in as (for an anonymous visitor signing in). */
  spareAccount: { email: string; password: string };
  /** A new session of the role (a new empty client for anonymous), for requests that end or replace sessions. */
  session(role: Role): Promise<Client>;
  /** Replaces the role's main session after something ended it. */
  renewSession(role: SignedInRole): Promise<void>;
  /** Per-request fixtures, made fresh so one role's successful request cannot change what the next role meets. */
  fresh: Fresh;
}

export interface Fresh {
  draftA(): Promise<string>;
  inReviewA(): Promise<string>;
  /** A started upload on `listing` (pending, nothing stored yet). */
  pendingUpload(listing: string): Promise<string>;
  /** A started upload whose bytes are in storage, waiting for …/complete. */
  uploadedFile(listing: string): Promise<string>;
  buyerCartItem(): Promise<string>;
  buyerSavedSearch(): Promise<string>;
  /** A user made a member of lab A for this request. */
  memberOfLabA(): Promise<string>;
  /** A paid order of the buyer from lab A (bought in batches: checkouts one after another, payments in parallel). */
  paidOrder(): Promise<string>;
  /** The same, marked shipped by lab A's owner. */
  shippedOrder(): Promise<string>;
}

async function expectStatus(res: Response, status: number, what: string): Promise<Record<string, unknown>> {
  const text = await res.text();
  if (res.status !== status) throw new Error(`${what}: expected ${status}, got ${res.status}: ${text.slice(0, 500)}`);
  return text ? (JSON.parse(text) as Record<string, unknown>) : {};
}

let counter = 0;
/** Unique within a test file (each file has its own database). */
export const unique = (prefix: string) => `${prefix}-${Date.now().toString(36)}-${(counter++).toString(36)}`;

export { mirrorListing } from './listing-bodies';

export async function signedIn(app: TestApp, account: { email: string; password: string }): Promise<Client> {
  const c = new Client(app.origin);
  await expectStatus(await c.signIn(account.email, account.password), 200, `sign-in of ${account.email}`);
  return c;
}

export async function buildWorld(app: TestApp): Promise<World> {
  const { buildUser } = await import('../../src/server/db/factories');
  const { getDb, getClient } = await import('../../src/server/db/client');
  const { labMemberships } = await import('../../src/server/db/schema');

  await buildUser({ ...ACCOUNTS.unverified, name: 'Una Verified', roles: ['buyer'], verified: false });
  const spareAccount = { email: 'spare.visitor@lab.example', password: 'spare-password-1' };
  await buildUser({ ...spareAccount, name: 'Spare Visitor', roles: ['buyer'] });
  const bystander = (
    await buildUser({ email: 'bystander@lab.example', name: 'Bea Stander', password: 'bystander-password-1', roles: ['buyer'] })
  ).id;

  const signedInRoles = ROLES.filter((r): r is SignedInRole => r !== 'anonymous');
  const client = { anonymous: new Client(app.origin) } as Record<Role, Client>;
  const user = {} as Record<SignedInRole, Person>;
  for (const role of signedInRoles) {
    client[role] = await signedIn(app, ACCOUNTS[role]);
    const me = (await expectStatus(await client[role].get('/api/me'), 200, `me of ${role}`)).user as {
      id: string;
      name: string;
      labs: { id: string; slug: string }[];
    };
    user[role] = { id: me.id, name: me.name, ...ACCOUNTS[role] };
  }
  const labOf = async (role: SignedInRole) =>
    ((await (await client[role].get('/api/me')).json()).user.labs as { id: string; slug: string }[])[0]!;
  const labA = await labOf('ownerA');
  const labB = await labOf('ownerB');

  const seeded = async (status: string) => {
    const r = await getClient().execute({
      sql: 'SELECT id FROM listings WHERE lab_id = ? AND status = ? ORDER BY title LIMIT 1',
      args: [labA.id, status],
    });
    if (!r.rows[0]) throw new Error(`The seed has no ${status} listing of lab A`);
    return String(r.rows[0].id);
  };
  const liveA = await seeded('live');
  const reviewA = await seeded('in-review');

  const draftIn = async (c: Client, title: string, quantity = 1) =>
    String((await expectStatus(await c.post('/api/listings', mirrorListing(title, quantity)), 201, `a new listing "${title}"`)).id);
  const approved = async (c: Client, title: string, quantity: number) => {
    const id = await draftIn(c, title, quantity);
    await expectStatus(await c.post(`/api/listings/${id}/submit`), 200, `submitting ${id}`);
    await expectStatus(await client.moderator.post(`/api/moderation/listings/${id}`, { action: 'approve' }), 200, `approving ${id}`);
    return id;
  };
  const thirdLab = await signedIn(app, demo('seller3'));
  const stock = await approved(thirdLab, 'Stock of a third lab', 1000);
  const stockA = await approved(client.ownerA, 'Stock of lab A', 1000);
  const draftA = await draftIn(client.ownerA, 'Lab A draft for edits');

  const png = await sharp({ create: { width: 32, height: 24, channels: 3, background: '#1f6f8b' } })
    .png()
    .toBuffer();
  /** A photo upload announced for the listing (the PUT not yet made). */
  const announceUpload = async (listing: string) =>
    expectStatus(
      await client.ownerA.post(`/api/listings/${listing}/uploads`, {
        kind: 'photo',
        filename: 'part.png',
        contentType: 'image/png',
        size: png.byteLength,
      }),
      201,
      `an upload to ${listing}`,
    );
  const pendingUpload = async (listing: string) => String((await announceUpload(listing)).fileId);
  const uploadedFile = async (listing: string) => {
    const created = await announceUpload(listing);
    const put = await fetch(String(created.uploadUrl), {
      method: 'PUT',
      headers: { 'content-type': 'image/png' },
      body: new Uint8Array(png),
    });
    if (put.status !== 200) throw new Error(`PUT to storage answered ${put.status}`);
    return String(created.fileId);
  };
  const readyFile = async (listing: string) => {
    const id = await uploadedFile(listing);
    await expectStatus(await client.ownerA.post(`/api/listings/${listing}/uploads/${id}/complete`), 200, `completing ${id}`);
    return id;
  };
  const fileLive = await readyFile(liveA);
  const fileHidden = await readyFile(reviewA);

  const thread = String(
    (
      await expectStatus(
        await client.buyer.post(`/api/listings/${liveA}/questions`, { body: 'Is the coating still within spec?' }),
        201,
        'a question',
      )
    ).threadId,
  );
  const report = String(
    (
      await expectStatus(
        await client.buyer.post(`/api/listings/${liveA}/reports`, { reason: 'The price looks like a typo.' }),
        201,
        'a report',
      )
    ).id,
  );
  const buyerSavedSearch = async () =>
    String(
      (
        (
          await expectStatus(
            await client.buyer.post('/api/saved-searches', {
              name: unique('Mirrors'),
              search: { mode: 'text', q: 'mirror' },
              url: '/search?q=mirror',
            }),
            201,
            'a saved search',
          )
        ).savedSearch as { id: string }
      ).id,
    );
  const savedSearch = await buyerSavedSearch();

  const orderStatus = async (id: string) =>
    String((await getClient().execute({ sql: 'SELECT status FROM orders WHERE id = ?', args: [id] })).rows[0]?.status);
  const paidOrders = async (n: number) => {
    const made: { id: string; sessionId: string }[] = [];
    // one checkout takes the whole cart: empty it first, and check out one order after another
    const cart = await expectStatus(await client.buyer.get('/api/cart'), 200, 'the cart');
    for (const item of cart.items as { id: string }[])
      await expectStatus(await client.buyer.del(`/api/cart/items/${item.id}`), 200, 'emptying the cart');
    for (let i = 0; i < n; i++) {
      await expectStatus(await client.buyer.post('/api/cart/items', { listingId: stockA, quantity: 1 }), 201, 'a cart item');
      const co = await expectStatus(await client.buyer.post('/api/checkout', {}), 201, 'a checkout');
      made.push({ id: (co.orderIds as string[])[0]!, sessionId: String(co.sessionId) });
    }
    await Promise.all(made.map((o) => payWithCard(app, o.sessionId, '4242424242424242')));
    await until(
      'the orders to be paid',
      async () => (await Promise.all(made.map((o) => orderStatus(o.id)))).every((s) => s === 'paid'),
      30_000,
    );
    return made;
  };
  const [order] = await paidOrders(1);
  const orderPool: string[] = [];
  const paidOrder = async () => {
    if (!orderPool.length) orderPool.push(...(await paidOrders(8)).map((o) => o.id));
    return orderPool.pop()!;
  };

  const invitee = 'invitee.elsewhere@lab.example';
  await expectStatus(await client.ownerA.post(`/api/labs/${labA.id}/invites`, { email: invitee }), 201, 'an invitation');
  const inviteToken = new URL(linkIn(await waitForMail(app.mailDir, invitee, /Join/), '/invites/accept')).searchParams.get('token')!;

  return {
    app,
    client,
    user,
    labA,
    labB,
    liveA,
    reviewA,
    stock,
    stockA,
    draftA,
    fileLive,
    fileHidden,
    thread,
    report,
    savedSearch,
    order: order!,
    inviteToken,
    bystander,
    spareAccount,
    async session(role) {
      return role === 'anonymous' ? new Client(app.origin) : signedIn(app, ACCOUNTS[role]);
    },
    async renewSession(role) {
      client[role] = await signedIn(app, ACCOUNTS[role]);
    },
    fresh: {
      draftA: () => draftIn(client.ownerA, unique('Fresh draft')),
      async inReviewA() {
        const id = await draftIn(client.ownerA, unique('Fresh draft for review'));
        await expectStatus(await client.ownerA.post(`/api/listings/${id}/submit`), 200, `submitting ${id}`);
        return id;
      },
      pendingUpload,
      uploadedFile,
      async buyerCartItem() {
        const cart = await expectStatus(await client.buyer.post('/api/cart/items', { listingId: stock, quantity: 1 }), 201, 'a cart item');
        return (cart.items as { id: string; listingId: string }[]).find((i) => i.listingId === stock)!.id;
      },
      buyerSavedSearch,
      async memberOfLabA() {
        const { id } = await buildUser({
          email: `${unique('member')}@lab.example`,
          name: 'Spare Member',
          password: 'spare-member-pw-1',
          roles: ['buyer', 'seller'],
        });
        await getDb().insert(labMemberships).values({ labId: labA.id, userId: id, role: 'member' });
        return id;
      },
      paidOrder,
      async shippedOrder() {
        const id = await paidOrder();
        await expectStatus(
          await client.ownerA.post(`/api/orders/${id}/ship`, { carrier: 'Lab courier', trackingNumber: 'LY-FIXTURE' }),
          200,
          `shipping ${id}`,
        );
        return id;
      },
    },
  };
}
