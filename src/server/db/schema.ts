import { sql } from 'drizzle-orm';
import { ROLE_NAMES, type RoleName } from '../../lib/roles';
import { index, integer, primaryKey, sqliteTable, text } from 'drizzle-orm/sqlite-core';

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

export type User = typeof users.$inferSelect;
export type Lab = typeof labs.$inferSelect;
