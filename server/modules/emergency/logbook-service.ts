import { and, desc, eq, sql } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { sites } from '../../db/schema/sites';
import { users } from '../../db/schema/organizations';
import { emergencyTests, emergencyTestSchedules } from '../../db/schema/emergency';
import type { SessionUser } from '@shared/schemas/auth';
import { DEFAULT_TEST_SCHEDULE, testDueDates, type TestSchedule } from '@shared/core/emergency-schedule';
import { logbookEntryBodySchema, type LogbookEntry, type LogbookEntryBody, type SiteLogbook, type TestsDueOverview } from '@shared/schemas/emergency';
import { unprocessable } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { getSiteRow, siteConditions } from '../sites/sites-service';

type TestRow = typeof emergencyTests.$inferSelect;

/** Today's calendar date in the site's time zone (due dates are calendar dates where the site is). */
export function localDate(ms: number, timeZone: string): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(ms));
}

export function scheduleOf(db: Db, organizationId: number): TestSchedule {
  const row = db.select().from(emergencyTestSchedules).where(eq(emergencyTestSchedules.organizationId, organizationId)).get();
  return row ? { functionalEveryDays: row.functionalEveryDays, fullDurationEveryMonths: row.fullDurationEveryMonths } : DEFAULT_TEST_SCHEDULE;
}

export function setSchedule(deps: Deps, user: SessionUser, schedule: TestSchedule): TestSchedule {
  deps.db.transaction((tx) => {
    const prev = tx.select().from(emergencyTestSchedules).where(eq(emergencyTestSchedules.organizationId, user.organizationId)).get();
    if (prev) tx.update(emergencyTestSchedules).set(schedule).where(eq(emergencyTestSchedules.organizationId, user.organizationId)).run();
    else tx.insert(emergencyTestSchedules).values({ organizationId: user.organizationId, ...schedule }).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'organization', entityId: user.organizationId, action: 'emergency_test_schedule_changed', before: prev ? { functionalEveryDays: prev.functionalEveryDays, fullDurationEveryMonths: prev.fullDurationEveryMonths } : DEFAULT_TEST_SCHEDULE, after: schedule, at: deps.clock.now() });
  });
  return schedule;
}

function present(r: TestRow, recordedByName: string | null): LogbookEntry {
  return {
    id: r.id, siteId: r.siteId, kind: r.kind, testedOn: r.testedOn, testedBy: r.testedBy, result: r.result, failedFittings: r.failedFittings,
    remarks: r.remarks, recordedByName, createdAt: new Date(r.createdAt).toISOString(),
  };
}

function entriesOf(db: Db, siteId: number) {
  return db.select({ t: emergencyTests, name: users.name }).from(emergencyTests).leftJoin(users, eq(users.id, emergencyTests.recordedBy))
    .where(eq(emergencyTests.siteId, siteId)).orderBy(desc(emergencyTests.testedOn), desc(emergencyTests.id)).all();
}

export function siteLogbook(deps: Deps, user: SessionUser, siteId: number, limit = 50): SiteLogbook {
  const site = getSiteRow(deps.db, user, siteId);
  const schedule = scheduleOf(deps.db, user.organizationId);
  const today = localDate(deps.clock.now(), site.timeZone);
  const all = entriesOf(deps.db, site.id);
  return {
    siteId: site.id, siteName: site.name, siteTimeZone: site.timeZone, today, schedule,
    due: testDueDates(all.map((e) => e.t), schedule, today), entries: all.slice(0, limit).map((e) => present(e.t, e.name)), total: all.length,
  };
}

/** Records a test (append-only). A test dated after today in the site's zone is refused. */
export function addLogbookEntry(deps: Deps, user: SessionUser, siteId: number, input: LogbookEntryBody): LogbookEntry {
  const site = getSiteRow(deps.db, user, siteId);
  const body = logbookEntryBodySchema.parse(input);
  const now = deps.clock.now();
  const today = localDate(now, site.timeZone);
  if (body.testedOn > today) throw unprocessable(`The test date ${body.testedOn} is after today (${today} at ${site.name}): record tests once they are done`, { field: 'testedOn' });
  const row = deps.db.transaction((tx) => {
    const r = tx.insert(emergencyTests).values({ organizationId: user.organizationId, siteId: site.id, ...body, recordedBy: user.id, createdAt: now }).returning().get();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'emergency_test', entityId: r.id, action: 'recorded', after: { siteId: site.id, ...body }, at: now });
    return r;
  });
  return present(row, user.name);
}

/** Every visible site's due tests (the overview and the facility manager's list). */
export function testsDueOverview(deps: Deps, user: SessionUser): TestsDueOverview {
  const schedule = scheduleOf(deps.db, user.organizationId);
  const siteRows = deps.db.select().from(sites).where(and(...siteConditions(deps.db, user))).orderBy(sites.name).all();
  const now = deps.clock.now();
  return {
    schedule,
    sites: siteRows.map((s) => {
      const today = localDate(now, s.timeZone);
      const entries = deps.db.select({ kind: emergencyTests.kind, testedOn: emergencyTests.testedOn, result: emergencyTests.result }).from(emergencyTests).where(eq(emergencyTests.siteId, s.id)).all();
      return { siteId: s.id, siteName: s.name, today, due: testDueDates(entries, schedule, today) };
    }),
  };
}

/** Number of logbook entries of a site (used by the report to say how many it left out). */
export function logbookCount(db: Db, siteId: number): number {
  return db.select({ n: sql<number>`count(*)` }).from(emergencyTests).where(eq(emergencyTests.siteId, siteId)).get()!.n;
}
