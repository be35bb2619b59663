import { sql } from 'drizzle-orm';
import { ROLE_NAMES, type RoleName } from '../../lib/roles';
import {
  CATEGORIES,
  CONDITIONS,
  FILE_KINDS,
  LISTING_STATUSES,
  MEASUREMENT_KINDS,
  type Hazard,
  type Region,
} from '../../lib/listings/constants';
import { index, integer, primaryKey, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

const createdAt = () =>
  integer('created_at', { mode: 'timestamp_ms' })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`);

export { ROLE_NAMES, type RoleName };

export const users = sqliteTable('users', {
  id: text('id').primaryKey(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  emailVerifiedAt: integer('email_verified_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`),
});

/** lucia's adapter writes expires_at as unix seconds. */
export const sessions = sqliteTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: integer('expires_at').notNull(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const roles = sqliteTable('roles', {
  name: text('name', { enum: ROLE_NAMES }).primaryKey(),
  description: text('description').notNull(),
});

export const userRoles = sqliteTable(
  'user_roles',
  {
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text('role', { enum: ROLE_NAMES })
      .notNull()
      .references(() => roles.name),
    grantedBy: text('granted_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.role] })],
);

export const labs = sqliteTable('labs', {
  id: text('id').primaryKey(),
  slug: text('slug').notNull().unique(),
  name: text('name').notNull(),
  institute: text('institute').notNull(),
  country: text('country').notNull(),
  createdAt: createdAt(),
});

export const LAB_MEMBER_ROLES = ['owner', 'member'] as const;
export type LabMemberRole = (typeof LAB_MEMBER_ROLES)[number];

export const labMemberships = sqliteTable(
  'lab_memberships',
  {
    labId: text('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text('role', { enum: LAB_MEMBER_ROLES }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.labId, t.userId] }), index('lab_memberships_user_idx').on(t.userId)],
);

export const labInvites = sqliteTable(
  'lab_invites',
  {
    id: text('id').primaryKey(),
    labId: text('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    invitedBy: text('invited_by').references(() => users.id, { onDelete: 'set null' }),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
    acceptedBy: text('accepted_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('lab_invites_lab_idx').on(t.labId)],
);

export const EMAIL_TOKEN_KINDS = ['verify', 'reset'] as const;

/** Single-use tokens sent by e-mail; only their SHA-256 is stored. */
export const emailTokens = sqliteTable(
  'email_tokens',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: EMAIL_TOKEN_KINDS }).notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    usedAt: integer('used_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [index('email_tokens_user_idx').on(t.userId, t.kind)],
);

export const SIGN_IN_SCOPES = ['account', 'address'] as const;

/** One row per failed sign-in per scope; shared by every app instance through the database. */
export const signInFailures = sqliteTable(
  'sign_in_failures',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    scope: text('scope', { enum: SIGN_IN_SCOPES }).notNull(),
    key: text('key').notNull(),
    at: integer('at', { mode: 'number' }).notNull(),
  },
  (t) => [index('sign_in_failures_key_idx').on(t.scope, t.key, t.at)],
);

/** Generic fixed-window counters for public endpoints (fit API and others). */
export const rateCounters = sqliteTable(
  'rate_counters',
  {
    bucket: text('bucket').notNull(),
    windowStart: integer('window_start', { mode: 'number' }).notNull(),
    count: integer('count').notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.bucket, t.windowStart] })],
);

export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    actorId: text('actor_id').references(() => users.id, { onDelete: 'set null' }),
    action: text('action').notNull(),
    subjectType: text('subject_type').notNull(),
    subjectId: text('subject_id').notNull(),
    data: text('data', { mode: 'json' }).$type<Record<string, unknown>>(),
    createdAt: createdAt(),
  },
  (t) => [index('audit_log_subject_idx').on(t.subjectType, t.subjectId)],
);

export const MAIL_STATUSES = ['pending', 'sent', 'failed'] as const;

/** Every outgoing e-mail is written here first and delivered from here, so a mail relay outage loses nothing. */
export const mailOutbox = sqliteTable(
  'mail_outbox',
  {
    id: text('id').primaryKey(),
    to: text('to').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html'),
    status: text('status', { enum: MAIL_STATUSES }).notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    nextAttemptAt: integer('next_attempt_at', { mode: 'number' }).notNull(),
    sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [index('mail_outbox_due_idx').on(t.status, t.nextAttemptAt)],
);

/** What the public sees of a listing: the last approved version, kept while an edit waits in review. */
export interface PublishedListing {
  title: string;
  description: string;
  condition: (typeof CONDITIONS)[number];
  priceCents: number;
  currency: string;
  shipsTo: Region[];
  specs: Record<string, unknown>;
  approvedAt: number;
}

export const listings = sqliteTable(
  'listings',
  {
    id: text('id').primaryKey(),
    labId: text('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'restrict' }),
    category: text('category', { enum: CATEGORIES }).notNull(),
    status: text('status', { enum: LISTING_STATUSES }).notNull().default('draft'),
    title: text('title').notNull(),
    description: text('description').notNull().default(''),
    condition: text('condition', { enum: CONDITIONS }).notNull(),
    quantity: integer('quantity').notNull(),
    priceCents: integer('price_cents').notNull(),
    currency: text('currency').notNull(),
    shipsTo: text('ships_to', { mode: 'json' }).$type<Region[]>().notNull(),
    specs: text('specs', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    published: text('published', { mode: 'json' }).$type<PublishedListing>(),
    reviewReason: text('review_reason'),
    hazards: text('hazards', { mode: 'json' })
      .$type<Hazard[]>()
      .notNull()
      .default(sql`'[]'`),
    exportControlled: integer('export_controlled', { mode: 'boolean' }).notNull().default(false),
    exportNote: text('export_note'),
    version: integer('version').notNull().default(1),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
      .notNull()
      .default(sql`(unixepoch('subsec') * 1000)`),
    submittedAt: integer('submitted_at', { mode: 'timestamp_ms' }),
  },
  (t) => [
    index('listings_lab_idx').on(t.labId),
    index('listings_status_idx').on(t.status, t.submittedAt),
    index('listings_updated_idx').on(t.updatedAt),
  ],
);

export const FILE_STATUSES = ['pending', 'ready', 'refused'] as const;

export interface FileVariants {
  /** Re-encoded full image (no metadata), and WebP thumbnails. */
  full?: string;
  w320?: string;
  w1280?: string;
}

export const listingFiles = sqliteTable(
  'listing_files',
  {
    id: text('id').primaryKey(),
    listingId: text('listing_id')
      .notNull()
      .references(() => listings.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: FILE_KINDS }).notNull(),
    measurementKind: text('measurement_kind', { enum: MEASUREMENT_KINDS }),
    filename: text('filename').notNull(),
    contentType: text('content_type').notNull(),
    size: integer('size').notNull(),
    storageKey: text('storage_key').notNull(),
    status: text('status', { enum: FILE_STATUSES }).notNull().default('pending'),
    error: text('error'),
    width: integer('width'),
    height: integer('height'),
    variants: text('variants', { mode: 'json' }).$type<FileVariants>(),
    data: text('data', { mode: 'json' }).$type<Record<string, unknown>>(),
    position: integer('position').notNull().default(0),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('listing_files_listing_idx').on(t.listingId, t.kind)],
);

export const listingThreads = sqliteTable(
  'listing_threads',
  {
    id: text('id').primaryKey(),
    listingId: text('listing_id')
      .notNull()
      .references(() => listings.id, { onDelete: 'cascade' }),
    buyerId: text('buyer_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: createdAt(),
    lastMessageAt: integer('last_message_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (t) => [uniqueIndex('listing_threads_pair_idx').on(t.listingId, t.buyerId)],
);

export const listingMessages = sqliteTable(
  'listing_messages',
  {
    id: text('id').primaryKey(),
    threadId: text('thread_id')
      .notNull()
      .references(() => listingThreads.id, { onDelete: 'cascade' }),
    authorId: text('author_id').references(() => users.id, { onDelete: 'set null' }),
    body: text('body').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('listing_messages_thread_idx').on(t.threadId, t.createdAt)],
);

export const REPORT_STATUSES = ['open', 'resolved'] as const;

export const listingReports = sqliteTable(
  'listing_reports',
  {
    id: text('id').primaryKey(),
    listingId: text('listing_id')
      .notNull()
      .references(() => listings.id, { onDelete: 'cascade' }),
    reporterId: text('reporter_id').references(() => users.id, { onDelete: 'set null' }),
    reason: text('reason').notNull(),
    status: text('status', { enum: REPORT_STATUSES }).notNull().default('open'),
    resolvedBy: text('resolved_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('listing_reports_listing_idx').on(t.listingId, t.status)],
);

export const SEARCH_MODES = ['text', 'cavity', 'squeezing', 'counting', 'laser'] as const;

/** A buyer's saved search: the whole query as the search page has it in its URL. */
export const savedSearches = sqliteTable(
  'saved_searches',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    mode: text('mode', { enum: SEARCH_MODES }).notNull(),
    query: text('query', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    /** Only its hash is stored; the e-mail carries the token for the sign-in-free unsubscribe link. */
    unsubscribeTokenHash: text('unsubscribe_token_hash').notNull().unique(),
    active: integer('active', { mode: 'boolean' }).notNull().default(true),
    lastNotifiedAt: integer('last_notified_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [index('saved_searches_user_idx').on(t.userId), index('saved_searches_active_idx').on(t.active)],
);

/** Which listings a saved search already announced, so a listing is mailed at most once per search. */
export const savedSearchHits = sqliteTable(
  'saved_search_hits',
  {
    savedSearchId: text('saved_search_id')
      .notNull()
      .references(() => savedSearches.id, { onDelete: 'cascade' }),
    listingId: text('listing_id')
      .notNull()
      .references(() => listings.id, { onDelete: 'cascade' }),
    notifiedAt: integer('notified_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.savedSearchId, t.listingId] })],
);

export const cartItems = sqliteTable(
  'cart_items',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    listingId: text('listing_id')
      .notNull()
      .references(() => listings.id, { onDelete: 'cascade' }),
    quantity: integer('quantity').notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('cart_items_user_listing_idx').on(t.userId, t.listingId)],
);

export const CHECKOUT_STATUSES = ['open', 'complete', 'expired', 'failed'] as const;

/** One payment-provider Checkout Session, paying one or more orders (one per lab). */
export const checkouts = sqliteTable(
  'checkouts',
  {
    id: text('id').primaryKey(),
    buyerId: text('buyer_id')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    providerSessionId: text('provider_session_id').unique(),
    status: text('status', { enum: CHECKOUT_STATUSES }).notNull().default('open'),
    currency: text('currency').notNull(),
    amountCents: integer('amount_cents').notNull(),
    /** Stock is held until then; released on expiry, decline or cancel. */
    reservedUntil: integer('reserved_until', { mode: 'timestamp_ms' }).notNull(),
    releasedAt: integer('released_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [index('checkouts_status_idx').on(t.status, t.reservedUntil)],
);

export const ORDER_STATUSES = [
  'pending_payment',
  'paid',
  'shipped',
  'received',
  'completed',
  'refund_requested',
  'refunded',
  'cancelled',
] as const;
export type OrderStatus = (typeof ORDER_STATUSES)[number];

export const orders = sqliteTable(
  'orders',
  {
    id: text('id').primaryKey(),
    checkoutId: text('checkout_id')
      .notNull()
      .references(() => checkouts.id, { onDelete: 'restrict' }),
    buyerId: text('buyer_id')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    labId: text('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'restrict' }),
    status: text('status', { enum: ORDER_STATUSES }).notNull().default('pending_payment'),
    currency: text('currency').notNull(),
    subtotalCents: integer('subtotal_cents').notNull(),
    /** Platform fee in basis points at the time of the order (800 = 8 %). */
    feeBps: integer('fee_bps').notNull(),
    feeCents: integer('fee_cents').notNull(),
    refundedCents: integer('refunded_cents').notNull().default(0),
    paymentIntentId: text('payment_intent_id'),
    chargeId: text('charge_id'),
    carrier: text('carrier'),
    trackingNumber: text('tracking_number'),
    endUseStatement: text('end_use_statement'),
    refundReason: text('refund_reason'),
    paidAt: integer('paid_at', { mode: 'timestamp_ms' }),
    shippedAt: integer('shipped_at', { mode: 'timestamp_ms' }),
    receivedAt: integer('received_at', { mode: 'timestamp_ms' }),
    inspectionEndsAt: integer('inspection_ends_at', { mode: 'timestamp_ms' }),
    completedAt: integer('completed_at', { mode: 'timestamp_ms' }),
    transferId: text('transfer_id'),
    version: integer('version').notNull().default(1),
    createdAt: createdAt(),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
      .notNull()
      .default(sql`(unixepoch('subsec') * 1000)`),
  },
  (t) => [
    index('orders_buyer_idx').on(t.buyerId),
    index('orders_lab_idx').on(t.labId, t.status),
    index('orders_checkout_idx').on(t.checkoutId),
  ],
);

export const orderItems = sqliteTable(
  'order_items',
  {
    id: text('id').primaryKey(),
    orderId: text('order_id')
      .notNull()
      .references(() => orders.id, { onDelete: 'cascade' }),
    listingId: text('listing_id')
      .notNull()
      .references(() => listings.id, { onDelete: 'restrict' }),
    title: text('title').notNull(),
    unitPriceCents: integer('unit_price_cents').notNull(),
    quantity: integer('quantity').notNull(),
  },
  (t) => [index('order_items_order_idx').on(t.orderId)],
);

/** Webhook events already handled, so a redelivered event changes nothing. */
export const providerEvents = sqliteTable('provider_events', {
  id: text('id').primaryKey(),
  type: text('type').notNull(),
  receivedAt: createdAt(),
});

export const payoutAccounts = sqliteTable('payout_accounts', {
  labId: text('lab_id')
    .primaryKey()
    .references(() => labs.id, { onDelete: 'cascade' }),
  providerAccountId: text('provider_account_id').notNull().unique(),
  detailsSubmitted: integer('details_submitted', { mode: 'boolean' }).notNull().default(false),
  chargesEnabled: integer('charges_enabled', { mode: 'boolean' }).notNull().default(false),
  payoutsEnabled: integer('payouts_enabled', { mode: 'boolean' }).notNull().default(false),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`),
});

export const transfers = sqliteTable(
  'transfers',
  {
    id: text('id').primaryKey(),
    orderId: text('order_id')
      .notNull()
      .unique()
      .references(() => orders.id, { onDelete: 'restrict' }),
    labId: text('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'restrict' }),
    amountCents: integer('amount_cents').notNull(),
    currency: text('currency').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('transfers_lab_idx').on(t.labId)],
);

export const PAYOUT_STATUSES = ['pending', 'in_transit', 'paid', 'failed', 'canceled'] as const;

export const payouts = sqliteTable(
  'payouts',
  {
    id: text('id').primaryKey(),
    labId: text('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'restrict' }),
    amountCents: integer('amount_cents').notNull(),
    currency: text('currency').notNull(),
    status: text('status', { enum: PAYOUT_STATUSES }).notNull(),
    failureMessage: text('failure_message'),
    createdAt: createdAt(),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
      .notNull()
      .default(sql`(unixepoch('subsec') * 1000)`),
  },
  (t) => [index('payouts_lab_idx').on(t.labId)],
);

export const refunds = sqliteTable(
  'refunds',
  {
    id: text('id').primaryKey(),
    orderId: text('order_id')
      .notNull()
      .references(() => orders.id, { onDelete: 'restrict' }),
    amountCents: integer('amount_cents').notNull(),
    reason: text('reason').notNull(),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('refunds_order_idx').on(t.orderId)],
);

export type User = typeof users.$inferSelect;
export type Listing = typeof listings.$inferSelect;
export type ListingFile = typeof listingFiles.$inferSelect;
export type Order = typeof orders.$inferSelect;
export type Checkout = typeof checkouts.$inferSelect;
export type Lab = typeof labs.$inferSelect;
