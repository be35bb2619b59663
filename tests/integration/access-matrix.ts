/**
 * Who may do what: every API route and page × every role → the status it must answer.
 *
 * Columns, in this order: anonymous, unverified user, buyer, member of lab A, owner of lab A, owner of
 * lab B, moderator, admin. Bodies pass validation, so a 2xx means the guard let the role through and a
 * 401/403/404 means it did not. Lab A is the Solvang Cavity QED Group, lab B the Quiet Light Laboratory;
 * orders, threads and saved searches belong to the buyer, and orders and threads are with lab A.
 * Pages answer 303 (to sign-in) where the API answers 401, and 404 where a thing must not be revealed.
 */
import Stripe from 'stripe';
import type { HttpMethod } from '../setup/routes';
import { mirrorListing, unique, type Role, type World } from '../setup/world';

export type Status = number | readonly number[];
export type Expected = readonly [Status, Status, Status, Status, Status, Status, Status, Status];

export interface Req {
  path: string;
  body?: unknown;
  headers?: Record<string, string>;
  /** Send from a new session of the role rather than its main one (the request ends or replaces sessions). */
  ownSession?: boolean;
}

export interface Row {
  /** The method the route file exports (ALL for a catch-all) and its path pattern in file syntax. */
  method: HttpMethod;
  route: string;
  expect: Expected;
  request(w: World, role: Role): Req | Promise<Req>;
  /** Names the row when a route has several (a live listing and one in review, say). */
  case?: string;
  /** The method sent for an ALL row. */
  send?: string;
  /** The request ends every session of the user (a password change): the role signs in again afterwards. */
  endsSessions?: boolean;
  /** Walked after every other row: it changes who the role is (creating a lab makes you an owner and a seller). */
  last?: boolean;
}

/** `row('POST /api/labs', statuses, request)`: the key is the exported method and the route's file pattern. */
function row(key: string, expect: Expected, request: Row['request'], more: Partial<Row> = {}): Row {
  const [method, route] = key.split(' ') as [HttpMethod, string];
  return { method, route, expect, request, ...more };
}
const path = (p: string) => () => ({ path: p });
const all = (s: Status): Expected => [s, s, s, s, s, s, s, s];
/** Anonymous gets `anon`; every signed-in role gets `s`. */
const signedIn = (s: Status, anon: Status = 401): Expected => [anon, s, s, s, s, s, s, s];

const password = (w: World, role: Role) => (role === 'anonymous' ? 'not-signed-in-1' : w.user[role].password);

/** The role's checkout of a unit of the third lab's stock, which goes into its cart first. */
async function checkout(w: World, role: Role): Promise<Req> {
  if (role !== 'anonymous') await w.client[role].post('/api/cart/items', { listingId: w.stock, quantity: 1 });
  return { path: '/api/checkout', body: { shipTo: 'EU' } };
}

const FIT_BODY = {
  goal: { wavelengthNm: 852, lengthM: 0.05, target: { kind: 'finesse', value: 100_000 }, configuration: 'pair' },
  mirrorA: mirrorListing('fit').specs,
};

/** An event of a type the app ignores, signed with the webhook secret the way the provider signs. */
function signedWebhook(w: World, role: Role): Req {
  const payload = JSON.stringify({
    id: `evt_${unique(role)}`,
    object: 'event',
    type: 'customer.created',
    created: Math.floor(Date.now() / 1000),
    livemode: false,
    data: { object: { id: 'cus_matrix', object: 'customer' } },
  });
  const signature = new Stripe('sk_test_matrix').webhooks.generateTestHeaderString({ payload, secret: w.app.env.STRIPE_WEBHOOK_SECRET! });
  return { path: '/api/webhooks/stripe', body: payload, headers: { 'stripe-signature': signature } };
}

// One row a line, so that the statuses read as the table they are.
// prettier-ignore
export const MATRIX: Row[] = [
  //                                                   anon unv  buy  memA ownA ownB mod  adm
  // ---- API ----
  row('ALL /api/[...rest]',                           [401, 404, 404, 404, 404, 404, 404, 404],  path('/api/no-such-route/here'), { send: 'GET' }),
  row('ALL /api/[...rest]',                           [401, 404, 404, 404, 404, 404, 404, 404],  path('/api/no-such-route/here'), { send: 'POST', case: 'a write' }),
  row('GET /api/admin/orders',                        [401, 403, 403, 403, 403, 403, 200, 200],  path('/api/admin/orders')),
  row('GET /api/admin/users',                         [401, 403, 403, 403, 403, 403, 403, 200],  path('/api/admin/users?q=demo')),
  row('POST /api/admin/users/[id]/roles',             [401, 403, 403, 403, 403, 403, 403, 200],  (w) => ({ path: `/api/admin/users/${w.bystander}/roles`, body: { role: 'seller' } })),
  row('DELETE /api/admin/users/[id]/roles/[role]',    [401, 403, 403, 403, 403, 403, 403, 200],  (w) => ({ path: `/api/admin/users/${w.bystander}/roles/seller` })),

  row('POST /api/auth/change-password',               signedIn(200),                             (w, role) => ({ path: '/api/auth/change-password', body: { currentPassword: password(w, role), newPassword: password(w, role) }, ownSession: true }), { endsSessions: true }),
  row('POST /api/auth/resend-verification',           signedIn(202),                             path('/api/auth/resend-verification')),
  row('POST /api/auth/reset-request',                 all(202),                                  () => ({ path: '/api/auth/reset-request', body: { email: 'nobody.here@lab.example' } })),
  // the token is the only authorization: an unknown one is refused whoever sends it
  row('POST /api/auth/reset',                         all(400),                                  () => ({ path: '/api/auth/reset', body: { token: 'x'.repeat(43), password: 'a-new-password-1' } })),
  row('POST /api/auth/sign-in',                       all(200),                                  (w, role) => ({ path: '/api/auth/sign-in', body: role === 'anonymous' ? w.spareAccount : { email: w.user[role].email, password: w.user[role].password }, ownSession: true })),
  row('POST /api/auth/sign-out',                      all(200),                                  () => ({ path: '/api/auth/sign-out', ownSession: true })),
  row('POST /api/auth/sign-up',                       all(201),                                  (_, role) => ({ path: '/api/auth/sign-up', body: { email: `${unique(role)}@lab.example`, password: 'sign-up-password-1', name: 'New Person' } })),
  row('POST /api/auth/verify',                        all(400),                                  () => ({ path: '/api/auth/verify', body: { token: 'y'.repeat(43) } })),

  row('GET /api/cart',                                signedIn(200),                             path('/api/cart')),
  row('POST /api/cart/items',                         signedIn(201),                             (w) => ({ path: '/api/cart/items', body: { listingId: w.stock, quantity: 1 } })),
  // someone else's cart line is not there for you
  row('DELETE /api/cart/items/[id]',                  [401, 404, 200, 404, 404, 404, 404, 404],  async (w) => ({ path: `/api/cart/items/${await w.fresh.buyerCartItem()}` })),
  row('POST /api/checkout',                           [401, 403, 201, 201, 201, 201, 201, 201],  checkout),

  row('GET /api/files/[fileId]',                      all(302),                                  (w) => ({ path: `/api/files/${w.fileLive}` }), { case: 'a photo of a live listing' }),
  row('GET /api/files/[fileId]',                      [401, 404, 404, 302, 302, 404, 302, 302],  (w) => ({ path: `/api/files/${w.fileHidden}` }), { case: 'a photo of a listing in review' }),
  row('POST /api/fit/[kind]',                         all(200),                                  () => ({ path: '/api/fit/cavity', body: FIT_BODY })),
  // the invitation is for another address: the token alone lets nobody in
  row('POST /api/invites/accept',                     [401, 403, 403, 403, 403, 403, 403, 403],  (w) => ({ path: '/api/invites/accept', body: { token: w.inviteToken } })),

  row('GET /api/labs',                                signedIn(200),                             path('/api/labs')),
  row('POST /api/labs',                               [401, 403, 201, 201, 201, 201, 201, 201],  (_, role) => ({ path: '/api/labs', body: { name: unique(`Lab of ${role}`), institute: 'Institute of Matrices', country: 'NL' } }), { last: true }),
  row('GET /api/labs/[lab]',                          [401, 403, 403, 200, 200, 403, 403, 403],  (w) => ({ path: `/api/labs/${w.labA.slug}` })),
  row('POST /api/labs/[lab]/invites',                 [401, 403, 403, 403, 201, 403, 403, 403],  (w, role) => ({ path: `/api/labs/${w.labA.id}/invites`, body: { email: `${unique(`invite-${role}`)}@lab.example` } })),
  row('DELETE /api/labs/[lab]/members/[user]',        [401, 403, 403, 403, 200, 403, 403, 403],  async (w) => ({ path: `/api/labs/${w.labA.id}/members/${await w.fresh.memberOfLabA()}` })),

  row('GET /api/listings',                            all(200),                                  path('/api/listings')),
  row('GET /api/listings',                            signedIn(200),                             path('/api/listings?mine=1'), { case: 'mine=1' }),
  row('POST /api/listings',                           [401, 403, 403, 201, 201, 201, 403, 403],  (_, role) => ({ path: '/api/listings', body: mirrorListing(unique(`Listed by ${role}`)) })),
  row('GET /api/listings/[id]',                       all(200),                                  (w) => ({ path: `/api/listings/${w.liveA}` }), { case: 'live' }),
  row('GET /api/listings/[id]',                       [404, 404, 404, 200, 200, 404, 200, 200],  (w) => ({ path: `/api/listings/${w.reviewA}` }), { case: 'in review' }),
  row('PATCH /api/listings/[id]',                     [401, 403, 403, 200, 200, 403, 403, 403],  (w) => ({ path: `/api/listings/${w.draftA}`, body: { quantity: 3 } })),
  row('DELETE /api/listings/[id]',                    [401, 403, 403, 200, 200, 403, 403, 403],  async (w) => ({ path: `/api/listings/${await w.fresh.draftA()}` })),
  row('POST /api/listings/[id]/duplicate',            [401, 403, 403, 201, 201, 403, 403, 403],  (w) => ({ path: `/api/listings/${w.reviewA}/duplicate` })),
  // the lab does not ask itself: 409 after the guard passed
  row('POST /api/listings/[id]/questions',            [401, 403, 201, 409, 409, 201, 201, 201],  (w) => ({ path: `/api/listings/${w.liveA}/questions`, body: { body: 'Does it come with a test report?' } })),
  row('POST /api/listings/[id]/reports',              signedIn(201),                             (w) => ({ path: `/api/listings/${w.liveA}/reports`, body: { reason: 'Looks like a duplicate listing.' } })),
  row('POST /api/listings/[id]/submit',               [401, 403, 403, 200, 200, 403, 403, 403],  async (w) => ({ path: `/api/listings/${await w.fresh.draftA()}/submit` })),
  row('POST /api/listings/[id]/uploads',              [401, 403, 403, 201, 201, 403, 403, 403],  (w) => ({ path: `/api/listings/${w.draftA}/uploads`, body: { kind: 'datasheet', filename: 'sheet.pdf', contentType: 'application/pdf', size: 1000 } })),
  row('DELETE /api/listings/[id]/uploads/[fileId]',   [401, 403, 403, 200, 200, 403, 403, 403],  async (w) => ({ path: `/api/listings/${w.draftA}/uploads/${await w.fresh.pendingUpload(w.draftA)}` })),
  row('POST /api/listings/[id]/uploads/[fileId]/complete', [401, 403, 403, 200, 200, 403, 403, 403],  async (w) => ({ path: `/api/listings/${w.liveA}/uploads/${await w.fresh.uploadedFile(w.liveA)}/complete` })),

  row('GET /api/me',                                  signedIn(200),                             path('/api/me')),
  row('PATCH /api/me',                                signedIn(200),                             (w, role) => ({ path: '/api/me', body: { name: role === 'anonymous' ? 'Nobody' : w.user[role].name } })),

  row('POST /api/moderation/listings/[id]',           [401, 403, 403, 403, 403, 403, 200, 200],  async (w) => ({ path: `/api/moderation/listings/${await w.fresh.inReviewA()}`, body: { action: 'approve' } })),
  row('POST /api/moderation/listings/[id]/flags',     [401, 403, 403, 403, 403, 403, 200, 200],  (w) => ({ path: `/api/moderation/listings/${w.draftA}/flags`, body: { hazards: ['fragile'], exportControlled: false } })),
  row('POST /api/moderation/reports/[id]/resolve',    [401, 403, 403, 403, 403, 403, 200, 200],  (w) => ({ path: `/api/moderation/reports/${w.report}/resolve` })),

  row('GET /api/orders',                              signedIn(200),                             path('/api/orders')),
  row('GET /api/orders/[id]',                         [401, 403, 200, 200, 200, 403, 200, 200],  (w) => ({ path: `/api/orders/${w.order.id}` })),
  // each role meets an order of its own, so one role's success cannot turn the next one's answer into a 409
  row('POST /api/orders/[id]/confirm-receipt',        [401, 403, 200, 403, 403, 403, 403, 403],  async (w) => ({ path: `/api/orders/${await w.fresh.shippedOrder()}/confirm-receipt` })),
  // the buyer asks for a refund, staff make one, the selling lab can do neither
  row('POST /api/orders/[id]/refund',                 [401, 403, 200, 403, 403, 403, 200, 200],  async (w) => ({ path: `/api/orders/${await w.fresh.paidOrder()}/refund`, body: { reason: 'Arrived scratched.' } })),
  row('POST /api/orders/[id]/ship',                   [401, 403, 403, 200, 200, 403, 403, 403],  async (w) => ({ path: `/api/orders/${await w.fresh.paidOrder()}/ship`, body: { carrier: 'Lab courier', trackingNumber: 'LY-0001' } })),

  row('GET /api/payouts',                             [401, 403, 403, 200, 200, 403, 403, 403],  (w) => ({ path: `/api/payouts?lab=${w.labA.id}` })),
  row('POST /api/payouts/onboarding',                 [401, 403, 403, 403, 200, 403, 403, 403],  (w) => ({ path: '/api/payouts/onboarding', body: { labId: w.labA.id } })),

  row('GET /api/saved-searches',                      signedIn(200),                             path('/api/saved-searches')),
  row('POST /api/saved-searches',                     [401, 403, 201, 201, 201, 201, 201, 201],  () => ({ path: '/api/saved-searches', body: { name: unique('Cs mirrors'), search: { mode: 'text', q: 'cesium' }, url: '/search?q=cesium' } })),
  row('PATCH /api/saved-searches/[id]',               [401, 404, 200, 404, 404, 404, 404, 404],  (w) => ({ path: `/api/saved-searches/${w.savedSearch}`, body: { active: false } })),
  row('DELETE /api/saved-searches/[id]',              [401, 404, 200, 404, 404, 404, 404, 404],  async (w) => ({ path: `/api/saved-searches/${await w.fresh.buyerSavedSearch()}` })),
  row('POST /api/saved-searches/unsubscribe',         all(404),                                  () => ({ path: '/api/saved-searches/unsubscribe', body: { token: 'z'.repeat(43) } })),

  row('GET /api/search',                              all(200),                                  path('/api/search?q=mirror&category=cavity-mirror')),
  row('POST /api/search/goal',                        all(200),                                  () => ({ path: '/api/search/goal', body: { mode: 'cavity', goal: { wavelengthNm: 852, finesse: 100_000, lengthMm: 50, configuration: 'pair' } } })),

  // staff may read a conversation (for reports) but only its two sides write in it
  row('GET /api/threads/[id]/messages',               [401, 403, 200, 200, 200, 403, 200, 200],  (w) => ({ path: `/api/threads/${w.thread}/messages` })),
  row('POST /api/threads/[id]/messages',              [401, 403, 201, 201, 201, 403, 403, 403],  (w) => ({ path: `/api/threads/${w.thread}/messages`, body: { body: 'Following up on this.' } })),

  // public by design: the signature is the authentication, a session is none
  row('POST /api/webhooks/stripe',                    all(200),                                  signedWebhook, { case: 'signed' }),
  row('POST /api/webhooks/stripe',                    all(400),                                  () => ({ path: '/api/webhooks/stripe', body: { id: 'evt_unsigned', type: 'checkout.session.completed' } }), { case: 'unsigned' }),

  // ---- pages ----
  row('GET /',                                        all(200),                                  path('/')),
  row('GET /403',                                     all(403),                                  path('/403')),
  row('GET /404',                                     all(404),                                  path('/404')),
  row('GET /account',                                 signedIn(200, 303),                        path('/account')),
  row('GET /admin',                                   [303, 403, 403, 403, 403, 403, 403, 200],  path('/admin')),
  row('GET /admin/orders',                            [303, 403, 403, 403, 403, 403, 200, 200],  path('/admin/orders')),
  row('GET /cart',                                    signedIn(200, 303),                        path('/cart')),
  row('GET /cautions',                                all(200),                                  path('/cautions')),
  row('GET /desk',                                    signedIn(200, 303),                        path('/desk')),
  row('GET /desk/listings/[id]',                      [303, 403, 403, 200, 200, 403, 403, 403],  (w) => ({ path: `/desk/listings/${w.reviewA}` })),
  row('GET /desk/listings/new',                       [303, 403, 403, 200, 200, 200, 403, 403],  path('/desk/listings/new')),
  // the inbox of the mail fake, there only while the app runs with FAKES=1 (the demo and the tests)
  row('GET /dev/mail',                                all(200),                                  path('/dev/mail')),
  row('GET /forgot-password',                         all(200),                                  path('/forgot-password')),
  row('GET /invites/accept',                          all(200),                                  (w) => ({ path: `/invites/accept?token=${w.inviteToken}` })),
  row('GET /labs/[slug]',                             [303, 403, 403, 200, 200, 403, 403, 403],  (w) => ({ path: `/labs/${w.labA.slug}` })),
  row('GET /listings/[id]',                           all(200),                                  (w) => ({ path: `/listings/${w.liveA}` }), { case: 'live' }),
  row('GET /listings/[id]',                           [404, 404, 404, 200, 200, 404, 200, 200],  (w) => ({ path: `/listings/${w.reviewA}` }), { case: 'in review' }),
  row('GET /messages',                                signedIn(200, 303),                        path('/messages')),
  row('GET /messages/[id]',                           [303, 403, 200, 200, 200, 403, 200, 200],  (w) => ({ path: `/messages/${w.thread}` })),
  row('GET /moderation',                              [303, 403, 403, 403, 403, 403, 200, 200],  path('/moderation')),
  row('GET /moderation/listings/[id]',                [303, 403, 403, 403, 403, 403, 200, 200],  (w) => ({ path: `/moderation/listings/${w.reviewA}` })),
  row('GET /orders',                                  signedIn(200, 303),                        path('/orders')),
  row('GET /orders/[id]',                             [303, 403, 200, 200, 200, 403, 200, 200],  (w) => ({ path: `/orders/${w.order.id}` })),
  row('GET /orders/paid',                             [303, 404, 200, 404, 404, 404, 404, 404],  (w) => ({ path: `/orders/paid?session_id=${w.order.sessionId}` })),
  row('GET /payouts',                                 [303, 403, 403, 200, 200, 403, 403, 403],  (w) => ({ path: `/payouts?lab=${w.labA.slug}` })),
  row('GET /reset-password',                          all(200),                                  path('/reset-password?token=abc')),
  row('GET /saved-searches',                          signedIn(200, 303),                        path('/saved-searches')),
  row('GET /search',                                  all(200),                                  path('/search?q=mirror')),
  row('GET /sign-in',                                 signedIn(303, 200),                        path('/sign-in')),
  row('POST /sign-out',                               all(303),                                  () => ({ path: '/sign-out', ownSession: true })),
  row('GET /sign-up',                                 signedIn(303, 200),                        path('/sign-up')),
  row('GET /tools',                                   all(200),                                  path('/tools')),
  // the unsubscribe link works without a session: the token decides, and an unknown one stops nothing
  row('GET /unsubscribe',                             all(200),                                  path(`/unsubscribe?token=${'z'.repeat(43)}`)),
  row('POST /unsubscribe',                            all(200),                                  () => ({ path: '/unsubscribe', body: `token=${'z'.repeat(43)}`, headers: { 'content-type': 'application/x-www-form-urlencoded' } })),
  row('GET /verify',                                  all(200),                                  path('/verify?token=abc')),
];
