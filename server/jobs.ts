import type { Deps } from './deps';
import type { SqliteSessionStore } from './http/session-store';

type Job = { name: string; everyMs: number; run: (deps: Deps) => Promise<unknown> | unknown };

/** Background jobs that run inside the server; modules add theirs to this list. */
export const JOBS: Job[] = [];

export function startJobs(deps: Deps, sessions: SqliteSessionStore): () => void {
  const timers = [setInterval(() => sessions.prune(), 3600_000)];
  for (const job of JOBS) {
    const tick = async () => {
      try { await job.run(deps); } catch (err) { console.error(`Job ${job.name} failed`, err); }
    };
    setTimeout(tick, 5_000).unref();
    timers.push(setInterval(tick, job.everyMs));
  }
  for (const t of timers) t.unref();
  return () => timers.forEach(clearInterval);
}
