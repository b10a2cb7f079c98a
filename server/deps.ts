import type { Db } from './db/client';
import type { Mailer } from './mail/mailer';
import type { Clock } from './lib/clock';
import type { Config } from './config';

/** What every module is built from; app.ts assembles it, tests pass their own. */
export type Deps = { db: Db; mailer: Mailer; clock: Clock; config: Config };
