import type { Deps } from './deps';
import type { SqliteSessionStore } from './http/session-store';
import { SqliteRateLimitStore } from './http/rate-limit-store';
import { SERVER_MODULES, type Job } from './modules';

/** The background jobs every module declares in server/modules.ts. */
export const serverJobs = (): Job[] => SERVER_MODULES.flatMap((m) => m.jobs ?? []);

/** The modules' timed jobs and the durable job queue's runner (mail delivery), in a real server only (config.runJobs); the returned function stops both. */
export function startJobs(deps: Deps, sessions: SqliteSessionStore): () => Promise<void> {
  const stopQueue = deps.jobs.start();
  const timers = [setInterval(() => { sessions.prune(); SqliteRateLimitStore.prune(deps.db, deps.clock.now()); }, 3600_000)];
  for (const job of serverJobs()) {
    const tick = async () => {
      try { await job.run(deps); } catch (err) { console.error(`Job ${job.name} failed`, err); }
    };
    setTimeout(tick, 5_000).unref();
    timers.push(setInterval(tick, job.everyMs));
  }
  for (const t of timers) t.unref();
  return async () => {
    timers.forEach(clearInterval);
    await stopQueue();
  };
}
