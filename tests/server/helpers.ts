import request from 'supertest';
import type { Test } from 'supertest';
import { openDatabase } from '@server/db/client';
import { testConfig, type Config } from '@server/config';
import { fixedClock } from '@server/lib/clock';
import { buildDeps } from '@server/deps';
import type { MailTransport } from '@server/mail/mailer';
import { createApp } from '@server/app';
import { seedIfEmpty, DEMO_PASSWORD } from '@server/db/seed';
import { outboxMessages } from '@server/db/schema/organizations';
import { desc } from 'drizzle-orm';

export const ORIGIN = 'http://localhost:3000';
export const DEMO_START = Date.parse('2026-11-20T09:00:00Z');

export const DEMO = {
  admin: 'admin@luxtrail.test',
  surveyor: 'surveyor@luxtrail.test',
  calibration: 'calibration@luxtrail.test',
  calibration2: 'calibration2@luxtrail.test',
  facility_manager: 'facilities@luxtrail.test',
  otherFacilityManager: 'facilities@elsewhere.test',
  otherAdmin: 'admin@elsewhere.test',
} as const;

/**
 * A fresh app on an in-memory database seeded with the demo scenario, a movable clock,
 * and the outbox (mail is queued there; `deliverMail()` runs the delivery jobs). Each test file (or test) makes its own.
 */
export async function createTestApp(overrides: Partial<Config> = {}, opts: { seed?: boolean; transport?: MailTransport } = {}) {
  const config = testConfig(overrides);
  const db = openDatabase(config.databaseUrl);
  const clock = fixedClock(DEMO_START);
  const deps = buildDeps({ db, clock, config, transport: opts.transport });
  if (opts.seed !== false) await seedIfEmpty(deps);
  const { app, routes } = createApp(deps);

  /** A cookie-keeping client that sends the app's own Origin, as the browser does. */
  function client() {
    const agent = request.agent(app);
    const withOrigin = <T extends Test>(t: T) => t.set('Origin', ORIGIN);
    return {
      agent,
      get: (url: string) => agent.get(url),
      post: (url: string) => withOrigin(agent.post(url)),
      patch: (url: string) => withOrigin(agent.patch(url)),
      put: (url: string) => withOrigin(agent.put(url)),
      delete: (url: string) => withOrigin(agent.delete(url)),
    };
  }

  async function signIn(email: string, password = DEMO_PASSWORD) {
    const c = client();
    const res = await c.post('/api/auth/login').send({ email, password });
    if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return c;
  }

  function lastMail() {
    return db.select().from(outboxMessages).orderBy(desc(outboxMessages.id)).get();
  }

  /** Runs the job queue once, as the server's runner would: delivers queued mail (building report PDFs). */
  function deliverMail() {
    return deps.jobs.runDue();
  }

  return { app, routes, deps, db, clock, config, client, signIn, lastMail, deliverMail };
}

export type TestApp = Awaited<ReturnType<typeof createTestApp>>;
export type TestClient = ReturnType<TestApp['client']>;

/** Pulls the token out of an invitation or reset link in a mail body. */
export function tokenFromMail(text: string): string {
  const m = text.match(/token=([A-Za-z0-9_%-]+)/);
  if (!m) throw new Error(`no token link in mail: ${text}`);
  return decodeURIComponent(m[1]);
}
