import session from 'express-session';
import { eq, lt } from 'drizzle-orm';
import type { Db } from '../db/client';
import { sessions } from '../db/schema/organizations';
import type { Clock } from '../lib/clock';

/**
 * A rolling session's expiry is written at most this often per session: every request writing it
 * would wait on (and block the event loop behind) a long import's writes (project's own choice).
 */
export const SESSION_TOUCH_INTERVAL_MS = 60_000;

/**
 * Ends every session of an account, in the caller's transaction: a password reset, disabling the
 * account or changing its role signs it out everywhere.
 */
export function endSessionsOf(tx: Pick<Db, 'delete'>, userId: number): number {
  return tx.delete(sessions).where(eq(sessions.userId, userId)).run().changes;
}

/** Server-side sessions kept in SQLite; expiry follows the injected clock. */
export class SqliteSessionStore extends session.Store {
  private readonly touchedAt = new Map<string, number>();

  constructor(private readonly db: Db, private readonly clock: Clock, private readonly ttlMs: number) {
    super();
  }

  override get(sid: string, cb: (err: unknown, s?: session.SessionData | null) => void) {
    try {
      const row = this.db.select().from(sessions).where(eq(sessions.sid, sid)).get();
      if (!row || row.expiresAt <= this.clock.now()) return cb(null, null);
      cb(null, JSON.parse(row.data));
    } catch (err) { cb(err); }
  }

  override set(sid: string, data: session.SessionData, cb?: (err?: unknown) => void) {
    try {
      const expiresAt = this.clock.now() + this.ttlMs;
      const json = JSON.stringify(data);
      // Kept beside the data so an account's sessions can be ended together (endSessionsOf).
      const userId = typeof data.userId === 'number' ? data.userId : null;
      this.db.insert(sessions).values({ sid, data: json, expiresAt, userId })
        .onConflictDoUpdate({ target: sessions.sid, set: { data: json, expiresAt, userId } }).run();
      cb?.();
    } catch (err) { cb?.(err); }
  }

  override touch(sid: string, _data: session.SessionData, cb?: (err?: unknown) => void) {
    try {
      const now = this.clock.now();
      const last = this.touchedAt.get(sid);
      if (last !== undefined && now - last >= 0 && now - last < SESSION_TOUCH_INTERVAL_MS) return cb?.();
      this.touchedAt.set(sid, now);
      this.db.update(sessions).set({ expiresAt: this.clock.now() + this.ttlMs }).where(eq(sessions.sid, sid)).run();
      cb?.();
    } catch (err) { cb?.(err); }
  }

  override destroy(sid: string, cb?: (err?: unknown) => void) {
    try {
      this.db.delete(sessions).where(eq(sessions.sid, sid)).run();
      this.touchedAt.delete(sid);
      cb?.();
    } catch (err) { cb?.(err); }
  }

  /** Drops expired rows; called now and then by the server. */
  prune() {
    const now = this.clock.now();
    this.db.delete(sessions).where(lt(sessions.expiresAt, now)).run();
    for (const [sid, at] of this.touchedAt) if (now - at > this.ttlMs) this.touchedAt.delete(sid);
  }
}
