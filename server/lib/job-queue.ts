import { and, asc, eq, inArray, lte, or, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { jobs } from '../db/schema/jobs';
import type { Clock } from './clock';

/** What `send` writes through: the caller's transaction, so the job commits with its cause. */
export type JobTx = Pick<Db, 'insert'>;

export type SendOptions = { maxAttempts?: number; runAt?: number };

export type JobContext = {
  id: number;
  /** 1 for the first try. */
  attempt: number;
  maxAttempts: number;
  /** When the runner tries again if this attempt throws; null on the last attempt. */
  retryAt: number | null;
};

export type JobHandler = (data: unknown, ctx: JobContext) => Promise<void> | void;

/**
 * The seam between Luxtrail and whatever runs its durable jobs. `send` and `work` have the shape
 * of a PostgreSQL queue such as pg-boss (`send(name, data, options)`, `work(name, handler)`), so
 * one could take over without touching the modules; today it is a table in the app's SQLite file.
 */
export type JobQueue = {
  /** Writes a job inside the caller's transaction; returns its id. */
  send(tx: JobTx, name: string, data: unknown, options?: SendOptions): number;
  /** The handler for a job name; a throw is a failed attempt. One handler per name. */
  work(name: string, handler: JobHandler): void;
  /** Runs the jobs that are due, one after another; resolves with how many ran. */
  runDue(limit?: number): Promise<number>;
  /** Start-up: jobs left running by a process that died are queued again. Returns how many. */
  recover(): number;
  /** Polls every `intervalMs` until the returned stop function is called. */
  start(intervalMs?: number): () => Promise<void>;
};

export const DEFAULT_MAX_ATTEMPTS = 8;
/** Retry after 30 s, then doubling up to an hour: 8 attempts span about an hour (our own choice). */
export const RETRY_BASE_MS = 30_000;
export const RETRY_MAX_MS = 3600_000;
/** A job running longer than this is presumed dead and taken again. */
export const JOB_LEASE_MS = 10 * 60_000;

export function retryDelayMs(failedAttempts: number): number {
  return Math.min(RETRY_MAX_MS, RETRY_BASE_MS * 2 ** Math.max(0, failedAttempts - 1));
}

/** The SQLite queue: rows in `jobs`, claimed one at a time by the single server process. */
export function createSqliteJobQueue(opts: { db: Db; clock: Clock; onError?: (name: string, err: unknown) => void }): JobQueue {
  const { db, clock } = opts;
  const handlers = new Map<string, JobHandler>();
  let busy: Promise<number> | null = null;

  function claimNext(now: number) {
    const names = [...handlers.keys()];
    if (names.length === 0) return null;
    return db.transaction((tx) => {
      const row = tx.select().from(jobs).where(and(inArray(jobs.name, names), or(
        and(eq(jobs.status, 'queued'), lte(jobs.runAt, now)),
        and(eq(jobs.status, 'running'), lte(jobs.lockedUntil, now)),
      ))).orderBy(asc(jobs.runAt), asc(jobs.id)).limit(1).get();
      if (!row) return null;
      tx.update(jobs).set({ status: 'running', attempts: sql`${jobs.attempts} + 1`, lockedUntil: now + JOB_LEASE_MS }).where(eq(jobs.id, row.id)).run();
      return { ...row, attempts: row.attempts + 1 };
    });
  }

  async function runOne(now: number): Promise<boolean> {
    const job = claimNext(now);
    if (!job) return false;
    const last = job.attempts >= job.maxAttempts;
    const retryAt = last ? null : now + retryDelayMs(job.attempts);
    try {
      await handlers.get(job.name)!(job.data, { id: job.id, attempt: job.attempts, maxAttempts: job.maxAttempts, retryAt });
      db.update(jobs).set({ status: 'done', lockedUntil: null, lastError: null, finishedAt: clock.now() }).where(eq(jobs.id, job.id)).run();
    } catch (err) {
      const message = err instanceof Error ? err.message : String(err);
      db.update(jobs).set(last
        ? { status: 'failed', lockedUntil: null, lastError: message, finishedAt: clock.now() }
        : { status: 'queued', lockedUntil: null, lastError: message, runAt: retryAt! }).where(eq(jobs.id, job.id)).run();
      opts.onError?.(job.name, err);
    }
    return true;
  }

  const queue: JobQueue = {
    send(tx, name, data, options = {}) {
      const now = clock.now();
      const row = tx.insert(jobs).values({ name, data: data ?? null, maxAttempts: options.maxAttempts ?? DEFAULT_MAX_ATTEMPTS, runAt: options.runAt ?? now, createdAt: now })
        .returning({ id: jobs.id }).get();
      return row.id;
    },
    work(name, handler) {
      if (handlers.has(name)) throw new Error(`Job "${name}" already has a handler`);
      handlers.set(name, handler);
    },
    runDue(limit = 50) {
      // One pass at a time: a second caller waits for the pass under way.
      if (busy) return busy;
      busy = (async () => {
        let ran = 0;
        try {
          while (ran < limit && await runOne(clock.now())) ran++;
        } finally { busy = null; }
        return ran;
      })();
      return busy;
    },
    recover() {
      return db.update(jobs).set({ status: 'queued', lockedUntil: null }).where(eq(jobs.status, 'running')).run().changes;
    },
    start(intervalMs = 1000) {
      let stopped = false;
      let timer: NodeJS.Timeout | null = null;
      const tick = async () => {
        timer = null;
        try { await queue.runDue(); } catch (err) { opts.onError?.('runner', err); }
        if (!stopped) timer = setTimeout(tick, intervalMs);
      };
      timer = setTimeout(tick, 0);
      return async () => {
        stopped = true;
        if (timer) clearTimeout(timer);
        await busy;
      };
    },
  };
  return queue;
}
