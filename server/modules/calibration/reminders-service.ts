import { and, eq, gt, inArray, ne } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { calibrationReminders, probes } from '../../db/schema/calibration';
import { organizations, users } from '../../db/schema/organizations';
import type { ReminderRunResponse } from '@shared/schemas/coefficient-sets';
import { DAY_MS } from '@shared/datetime';
import { probesWithCalibration } from '../probes/calibration-state';
import { absoluteUrl, paths } from '@shared/paths';

/** A probe is reminded when its set in force is due within this many days, or overdue. */
export const REMINDER_DUE_WITHIN_DAYS = 14;
/** At most one reminder per probe in this interval. */
export const REMINDER_INTERVAL_MS = 7 * DAY_MS;

const fmtDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/**
 * Queues for each organisation's active calibration users one message listing its probes that are
 * due within 14 days or overdue, skipping probes reminded in the last 7 days (calibration_reminders).
 * Retired probes and probes without an approved set are not reminded.
 */
export function runCalibrationReminders(deps: Deps, onlyOrganizationId?: number): ReminderRunResponse {
  const now = deps.clock.now();
  const orgs = deps.db.select().from(organizations).where(onlyOrganizationId ? eq(organizations.id, onlyOrganizationId) : undefined).all();
  const out: ReminderRunResponse = { messagesSent: 0, reminded: [], skippedRecentlyReminded: [] };
  for (const org of orgs) {
    const probeRows = deps.db.select().from(probes).where(and(eq(probes.organizationId, org.id), ne(probes.status, 'retired'))).all();
    const due = probesWithCalibration(deps, probeRows, REMINDER_DUE_WITHIN_DAYS)
      .filter((p) => p.current && (p.status.state === 'due_soon' || p.status.state === 'overdue'));
    if (due.length === 0) continue;
    const recent = new Set(deps.db.select({ probeId: calibrationReminders.probeId }).from(calibrationReminders)
      .where(and(inArray(calibrationReminders.probeId, due.map((d) => d.probe.id)), gt(calibrationReminders.sentAt, now - REMINDER_INTERVAL_MS))).all().map((r) => r.probeId));
    const toSend = due.filter((d) => !recent.has(d.probe.id));
    out.skippedRecentlyReminded = out.skippedRecentlyReminded.concat(due.filter((d) => recent.has(d.probe.id)).map((d) => d.probe.serial));
    if (toSend.length === 0) continue;
    const recipients = deps.db.select({ email: users.email }).from(users)
      .where(and(eq(users.organizationId, org.id), eq(users.role, 'calibration'), eq(users.status, 'active'))).all().map((u) => u.email);
    // Nobody to tell: record nothing, so the reminder goes out once someone is there.
    if (recipients.length === 0) continue;

    const lines = toSend
      .sort((a, b) => a.current!.dueDate - b.current!.dueDate)
      .map(({ probe, current, status }) => {
        const when = status.state === 'overdue' ? `OVERDUE since ${fmtDate(current!.dueDate)} (${-status.daysUntilDue!} days)` : `due ${fmtDate(current!.dueDate)} (in ${status.daysUntilDue} days)`;
        return `- ${probe.serial} (${probe.description || probe.kind}): ${when}; certificate ${current!.certificateNumber}, version ${current!.version}\n  ${absoluteUrl(deps.config.publicUrl, paths.probe.to(probe.id))}`;
      });
    const overdue = toSend.filter((d) => d.status.state === 'overdue').length;
    // The message and the record of what it reminded commit together: neither without the other.
    deps.db.transaction((tx) => {
      deps.mailer.queue(tx, {
        to: recipients,
        organizationId: org.id,
        subject: `Calibration reminder: ${toSend.length} probe(s) ${overdue ? `(${overdue} overdue) ` : ''}at ${org.name}`,
        text: `Hello,\n\nThese probes of ${org.name} need calibration. Readings taken after a due date are flagged "calibration lapsed" in surveys.\n\n${lines.join('\n')}\n\nYou get at most one reminder per probe per week.\n`,
      });
      for (const d of toSend) tx.insert(calibrationReminders).values({ probeId: d.probe.id, kind: d.status.state === 'overdue' ? 'overdue' : 'due_soon', sentAt: now }).run();
    });
    out.messagesSent++;
    out.reminded = out.reminded.concat(toSend.map((d) => ({ probeId: d.probe.id, serial: d.probe.serial, kind: d.status.state === 'overdue' ? 'overdue' as const : 'due_soon' as const, dueDate: new Date(d.current!.dueDate).toISOString() })));
  }
  return out;
}
