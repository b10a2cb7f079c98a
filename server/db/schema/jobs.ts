import { sqliteTable, integer, text, index } from 'drizzle-orm/sqlite-core';

/**
 * Durable background jobs (server/lib/job-queue.ts): a row is written in the transaction of the
 * change that needs it, so the work survives a crash after the commit; the runner retries with
 * back-off until `maxAttempts`, then marks it failed.
 */
/** A job's state. Stored codes; the server alone reads them, so this is their one home. */
export const JOB_STATUSES = ['queued', 'running', 'done', 'failed'] as const;

export const jobs = sqliteTable('jobs', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  data: text('data', { mode: 'json' }).notNull(),
  status: text('status', { enum: JOB_STATUSES }).notNull().default('queued'),
  attempts: integer('attempts').notNull().default(0),
  maxAttempts: integer('max_attempts').notNull(),
  runAt: integer('run_at').notNull(),
  /** A running job whose lease has passed is taken again (its runner died). */
  lockedUntil: integer('locked_until'),
  lastError: text('last_error'),
  createdAt: integer('created_at').notNull(),
  finishedAt: integer('finished_at'),
}, (t) => [index('jobs_due_idx').on(t.status, t.runAt)]);
