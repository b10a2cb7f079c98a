import session from 'express-session';
import { eq, lt } from 'drizzle-orm';
import type { Db } from '../db/client';
import { sessions } from '../db/schema/organizations';
import type { Clock } from '../lib/clock';

/** Server-side sessions kept in SQLite; expiry follows the injected clock. */
export class SqliteSessionStore extends session.Store {
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
      this.db.insert(sessions).values({ sid, data: json, expiresAt })
        .onConflictDoUpdate({ target: sessions.sid, set: { data: json, expiresAt } }).run();
      cb?.();
    } catch (err) { cb?.(err); }
  }

  override touch(sid: string, _data: session.SessionData, cb?: (err?: unknown) => void) {
    try {
      this.db.update(sessions).set({ expiresAt: this.clock.now() + this.ttlMs }).where(eq(sessions.sid, sid)).run();
      cb?.();
    } catch (err) { cb?.(err); }
  }

  override destroy(sid: string, cb?: (err?: unknown) => void) {
    try {
      this.db.delete(sessions).where(eq(sessions.sid, sid)).run();
      cb?.();
    } catch (err) { cb?.(err); }
  }

  /** Drops expired rows; called now and then by the server. */
  prune() {
    this.db.delete(sessions).where(lt(sessions.expiresAt, this.clock.now())).run();
  }
}
