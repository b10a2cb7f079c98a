import { eq, lt, sql } from 'drizzle-orm';
import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import type { Db } from '../db/client';
import { rateLimitHits } from '../db/schema/organizations';
import type { Clock } from '../lib/clock';

/**
 * An express-rate-limit store in SQLite: fixed windows per key, one upsert per request, on the
 * injected clock. Counters survive a restart; expired rows are removed by `prune`.
 */
export class SqliteRateLimitStore implements Store {
  windowMs = 15 * 60_000;
  localKeys = false;

  constructor(private readonly db: Db, private readonly clock: Clock, readonly prefix: string) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  private key(key: string) {
    return `${this.prefix}:${key}`;
  }

  /**
   * The window's end as express-rate-limit reads it: in wall-clock time, since it compares it with
   * Date.now() (a successful sign-in is not taken back once the window has ended). Our windows run
   * on the injected clock, so the time left is carried over.
   */
  private wallTime(resetAt: number) {
    return new Date(Date.now() + (resetAt - this.clock.now()));
  }

  get(key: string): ClientRateLimitInfo | undefined {
    const row = this.db.select().from(rateLimitHits).where(eq(rateLimitHits.key, this.key(key))).get();
    if (!row || row.resetAt <= this.clock.now()) return undefined;
    return { totalHits: row.hits, resetTime: this.wallTime(row.resetAt) };
  }

  increment(key: string): IncrementResponse {
    const now = this.clock.now();
    const expired = sql`${rateLimitHits.resetAt} <= ${now}`;
    const row = this.db.insert(rateLimitHits).values({ key: this.key(key), hits: 1, resetAt: now + this.windowMs })
      .onConflictDoUpdate({
        target: rateLimitHits.key,
        set: {
          hits: sql`case when ${expired} then 1 else ${rateLimitHits.hits} + 1 end`,
          resetAt: sql`case when ${expired} then ${now + this.windowMs} else ${rateLimitHits.resetAt} end`,
        },
      }).returning({ hits: rateLimitHits.hits, resetAt: rateLimitHits.resetAt }).get();
    return { totalHits: row.hits, resetTime: this.wallTime(row.resetAt) };
  }

  decrement(key: string) {
    this.db.update(rateLimitHits).set({ hits: sql`max(0, ${rateLimitHits.hits} - 1)` }).where(eq(rateLimitHits.key, this.key(key))).run();
  }

  resetKey(key: string) {
    this.db.delete(rateLimitHits).where(eq(rateLimitHits.key, this.key(key))).run();
  }

  /** Drops windows that have ended (any limiter's). */
  static prune(db: Db, now: number) {
    return db.delete(rateLimitHits).where(lt(rateLimitHits.resetAt, now)).run().changes;
  }
}
