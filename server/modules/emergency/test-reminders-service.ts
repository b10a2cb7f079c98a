import { and, eq, gt, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { organizations, users, userSites } from '../../db/schema/organizations';
import { sites } from '../../db/schema/sites';
import { emergencyTestReminders, emergencyTests } from '../../db/schema/emergency';
import { testDueDates } from '@shared/core/emergency-schedule';
import { absoluteUrl, paths } from '@shared/paths';
import { localDate, scheduleOf } from './logbook-service';

/** At most one reminder per site and test kind in this interval. */
export const TEST_REMINDER_INTERVAL_MS = 7 * 86_400_000;

const KIND_NAME = { functional: 'functional test', full_duration: 'full-duration test' } as const;

export type TestReminderRun = { messagesSent: number; reminded: { siteId: number; kind: 'functional' | 'full_duration'; state: 'due_soon' | 'overdue'; dueOn: string }[] };

/**
 * Queues an e-mail to the facility managers who look after a site (all of the organisation's facility
 * managers when one is not limited to sites) and its administrators when a site's emergency
 * lighting test is due within a week or overdue. Sites with no logbook entry are not reminded
 * (nothing says they have emergency lighting to test). Runs in the daily reminder job.
 */
export function runEmergencyTestReminders(deps: Deps, onlyOrganizationId?: number): TestReminderRun {
  const now = deps.clock.now();
  const out: TestReminderRun = { messagesSent: 0, reminded: [] };
  const orgs = deps.db.select().from(organizations).where(onlyOrganizationId ? eq(organizations.id, onlyOrganizationId) : undefined).all();
  for (const org of orgs) {
    const schedule = scheduleOf(deps.db, org.id);
    const people = deps.db.select({ id: users.id, email: users.email, role: users.role }).from(users)
      .where(and(eq(users.organizationId, org.id), eq(users.status, 'active'), inArray(users.role, ['facility_manager', 'admin']))).all();
    const limits = people.length ? deps.db.select().from(userSites).where(inArray(userSites.userId, people.map((p) => p.id))).all() : [];
    for (const site of deps.db.select().from(sites).where(eq(sites.organizationId, org.id)).all()) {
      const entries = deps.db.select({ kind: emergencyTests.kind, testedOn: emergencyTests.testedOn, result: emergencyTests.result }).from(emergencyTests).where(eq(emergencyTests.siteId, site.id)).all();
      if (entries.length === 0) continue;
      const due = testDueDates(entries, schedule, localDate(now, site.timeZone)).filter((d) => d.state === 'overdue' || d.state === 'due_soon');
      const recent = new Set(deps.db.select({ kind: emergencyTestReminders.kind }).from(emergencyTestReminders)
        .where(and(eq(emergencyTestReminders.siteId, site.id), gt(emergencyTestReminders.sentAt, now - TEST_REMINDER_INTERVAL_MS))).all().map((r) => r.kind));
      const toSend = due.filter((d) => !recent.has(d.kind));
      if (toSend.length === 0) continue;
      const recipients = people.filter((p) => {
        if (p.role === 'admin') return true;
        const mine = limits.filter((l) => l.userId === p.id);
        return mine.length === 0 || mine.some((l) => l.siteId === site.id);
      }).map((p) => p.email);
      if (recipients.length === 0) continue;
      const lines = toSend.map((d) => `- ${KIND_NAME[d.kind]}: ${d.state === 'overdue' ? `OVERDUE since ${d.dueOn} (${d.daysOverdue} days)` : `due ${d.dueOn}`}; last done ${d.lastTestedOn} (${d.lastResult === 'fail' ? 'failed' : 'passed'})`);
      // The message and the record of what it reminded commit together (the mail is queued, server/mail/mailer.ts).
      deps.db.transaction((tx) => {
        deps.mailer.queue(tx, {
          to: recipients,
          organizationId: org.id,
          subject: `Emergency lighting test ${toSend.some((d) => d.state === 'overdue') ? 'overdue' : 'due'} at ${site.name}`,
          text: `Hello,\n\nThe emergency lighting of ${site.name} (${org.name}) needs testing:\n\n${lines.join('\n')}\n\nRecord the test in the site's logbook: ${absoluteUrl(deps.config.publicUrl, paths.emergencyLogbook.to(site.id))}\n\nLuxtrail keeps the record; a competent person and the local codes decide what testing the installation needs.\nYou get at most one reminder per site and test a week.\n`,
        });
        for (const d of toSend) tx.insert(emergencyTestReminders).values({ siteId: site.id, kind: d.kind, state: d.state as 'due_soon' | 'overdue', sentAt: now }).run();
      });
      out.messagesSent++;
      out.reminded.push(...toSend.map((d) => ({ siteId: site.id, kind: d.kind, state: d.state as 'due_soon' | 'overdue', dueOn: d.dueOn as string })));
    }
  }
  return out;
}
