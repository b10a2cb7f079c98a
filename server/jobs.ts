import type { Deps } from './deps';
import type { SqliteSessionStore } from './http/session-store';

import { SERVER_MODULES, type Job } from './modules';

/** The background jobs every module declares in server/modules.ts. */
export const serverJobs = (): Job[] => SERVER_MODULES.flatMap((m) => m.jobs ?? []);

/** Runs the modules' jobs inside a real server (config.runJobs); returns a stop function. */
export function startJobs(deps: Deps, sessions: SqliteSessionStore): () => void {
  const timers = [setInterval(() => sessions.prune(), 3600_000)];
  for (const job of serverJobs()) {
    const tick = async () => {
      try { await job.run(deps); } catch (err) { console.error(`Job ${job.name} failed`, err); }
    };
    setTimeout(tick, 5_000).unref();
    timers.push(setInterval(tick, job.everyMs));
  }
  for (const t of timers) t.unref();
  return () => timers.forEach(clearInterval);
}
