import type { Db } from './db/client';
import { createMailer, transportFor, type Mailer, type MailTransport } from './mail/mailer';
import type { Clock } from './lib/clock';
import type { Config } from './config';
import { createSqliteJobQueue, type JobQueue } from './lib/job-queue';

/** What every module is built from; app.ts assembles it, tests pass their own. */
export type Deps = { db: Db; mailer: Mailer; jobs: JobQueue; clock: Clock; config: Config };

/** The durable job queue and the mailer on top of it; tests pass a transport of their own. */
export function buildDeps(opts: { db: Db; clock: Clock; config: Config; transport?: MailTransport; onJobError?: (name: string, err: unknown) => void }): Deps {
  const { db, clock, config } = opts;
  const jobs = createSqliteJobQueue({ db, clock, onError: opts.onJobError });
  const mailer = createMailer({ db, clock, jobs, transport: opts.transport ?? transportFor(config.smtpUrl) });
  return { db, mailer, jobs, clock, config };
}
