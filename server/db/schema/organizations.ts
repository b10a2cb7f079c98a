import { sqliteTable, integer, text, blob, primaryKey, index } from 'drizzle-orm/sqlite-core';
import type { Role } from '@shared/roles';
import { OUTBOX_STATUSES, USER_STATUSES } from '@shared/schemas/users';
import { DECISION_RULES } from '@shared/schemas/organization';
import { TOKEN_PURPOSES } from '@shared/schemas/auth';
import { GRID_ROUNDINGS } from '@shared/core/zone-stats';

/** Times are stored as integer milliseconds since the epoch (UTC) throughout. */
export const organizations = sqliteTable('organizations', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  /** Decision rule for verdicts: simple acceptance or guarded by U (ILAC-G8:2019). */
  decisionRule: text('decision_rule', { enum: DECISION_RULES }).notNull().default('guarded'),
  /** Default rounding of EN 12464-1 grid points per side for new surveys (shared/core GridRounding). */
  gridRounding: text('grid_rounding', { enum: GRID_ROUNDINGS }).notNull().default('next_higher'),
  createdAt: integer('created_at').notNull(),
});

export const users = sqliteTable('users', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  role: text('role').$type<Role>().notNull(),
  status: text('status', { enum: USER_STATUSES }).notNull(),
  passwordHash: text('password_hash'),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('users_org_idx').on(t.organizationId)]);

/** Sites a facility manager is limited to; no rows means every site of the organisation. */
export const userSites = sqliteTable('user_sites', {
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  siteId: integer('site_id').notNull(),
}, (t) => [primaryKey({ columns: [t.userId, t.siteId] })]);

/** Single-use invitation and reset tokens; only their SHA-256 is stored. */
export const tokens = sqliteTable('tokens', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  purpose: text('purpose', { enum: TOKEN_PURPOSES }).notNull(),
  tokenHash: text('token_hash').notNull().unique(),
  expiresAt: integer('expires_at').notNull(),
  usedAt: integer('used_at'),
  createdAt: integer('created_at').notNull(),
});

export const sessions = sqliteTable('sessions', {
  sid: text('sid').primaryKey(),
  data: text('data').notNull(),
  expiresAt: integer('expires_at').notNull(),
  /** The signed-in account (null before sign-in), so its sessions can be ended together. */
  userId: integer('user_id').references(() => users.id, { onDelete: 'cascade' }),
}, (t) => [index('sessions_expires_idx').on(t.expiresAt), index('sessions_user_idx').on(t.userId)]);

/**
 * Every e-mail Luxtrail sends, written in the same transaction as the change that causes it and
 * delivered afterwards by the job runner (server/mail/mailer.ts). Without SMTP_URL delivery only
 * marks the row sent: the Outbox page is then where mail is read.
 */
export const outboxMessages = sqliteTable('outbox_messages', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').references(() => organizations.id),
  to: text('to').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  html: text('html'),
  createdAt: integer('created_at').notNull(),
  status: text('status', { enum: OUTBOX_STATUSES }).notNull().default('sent'),
  attempts: integer('attempts').notNull().default(0),
  lastError: text('last_error'),
  /** When the runner tries again after a failed attempt (null when not waiting). */
  nextAttemptAt: integer('next_attempt_at'),
  sentAt: integer('sent_at'),
  /** Attachments built at delivery (e.g. a report PDF): [{kind, filename, params}], emptied once built. */
  pendingAttachments: text('pending_attachments', { mode: 'json' }).$type<PendingAttachment[]>(),
}, (t) => [index('outbox_org_idx').on(t.organizationId, t.id)]);

export type PendingAttachment = { kind: string; filename: string; params: Record<string, unknown> };

export const outboxAttachments = sqliteTable('outbox_attachments', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  messageId: integer('message_id').notNull().references(() => outboxMessages.id, { onDelete: 'cascade' }),
  filename: text('filename').notNull(),
  contentType: text('content_type').notNull(),
  content: blob('content', { mode: 'buffer' }).notNull(),
  size: integer('size').notNull(),
});

/** Append-only trail of who changed what; the API offers no update or delete. */
export const auditEvents = sqliteTable('audit_events', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  actorId: integer('actor_id').references(() => users.id),
  entityType: text('entity_type').notNull(),
  entityId: integer('entity_id').notNull(),
  action: text('action').notNull(),
  probeId: integer('probe_id'),
  surveyId: integer('survey_id'),
  before: text('before', { mode: 'json' }),
  after: text('after', { mode: 'json' }),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('audit_org_idx').on(t.organizationId, t.createdAt), index('audit_probe_idx').on(t.probeId)]);

/** Uploaded files (logs, bench runs, certificates, plans), stored on disk by content hash. */
export const storedFiles = sqliteTable('stored_files', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  sha256: text('sha256').notNull(),
  filename: text('filename').notNull(),
  contentType: text('content_type').notNull(),
  size: integer('size').notNull(),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('stored_files_hash_idx').on(t.organizationId, t.sha256)]);

/**
 * Fixed-window counters of the request limits (sign-in, forgot-password), kept here so a restart
 * does not hand an attacker a fresh budget (server/http/rate-limit-store.ts).
 */
export const rateLimitHits = sqliteTable('rate_limit_hits', {
  key: text('key').primaryKey(),
  hits: integer('hits').notNull(),
  resetAt: integer('reset_at').notNull(),
}, (t) => [index('rate_limit_reset_idx').on(t.resetAt)]);
