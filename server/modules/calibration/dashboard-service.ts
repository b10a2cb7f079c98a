import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { calibrationReminders, probes } from '../../db/schema/calibration';
import type { SessionUser } from '@shared/schemas/auth';
import { DASHBOARD_DUE_SOON_DAYS, type DashboardResponse, type DashboardRow } from '@shared/schemas/probes';
import { probesWithCalibration } from '../probes/calibration-state';
import { visibleStatuses } from '../probes/probes-service';

/** The calibration dashboard: every probe with its due date and state; the screen sorts and filters. */
export function calibrationDashboard(deps: Deps, user: SessionUser): DashboardResponse {
  const statuses = visibleStatuses(user);
  const probeRows = deps.db.select().from(probes).where(and(
    eq(probes.organizationId, user.organizationId),
    statuses ? inArray(probes.status, statuses) : undefined,
  )).orderBy(asc(probes.serial)).all();
  const rows = probesWithCalibration(deps, probeRows, DASHBOARD_DUE_SOON_DAYS);
  const reminders = probeRows.length
    ? deps.db.select().from(calibrationReminders).where(inArray(calibrationReminders.probeId, probeRows.map((p) => p.id))).orderBy(desc(calibrationReminders.sentAt)).all()
    : [];
  const iso = (ms: number) => new Date(ms).toISOString();
  const items = rows.map(({ probe, sets, status, current }): DashboardRow => {
    const last = reminders.find((r) => r.probeId === probe.id);
    return {
      probeId: probe.id, serial: probe.serial, kind: probe.kind, status: probe.status, description: probe.description,
      calibrationState: status.state, currentSetId: current?.id ?? null, currentVersion: current?.version ?? null,
      certificateNumber: current?.certificateNumber ?? null, dueDate: current ? iso(current.dueDate) : null, daysUntilDue: status.daysUntilDue,
      draftCount: sets.filter((s) => s.status === 'draft').length, lastReminderAt: last ? iso(last.sentAt) : null,
    };
  });
  return { now: iso(deps.clock.now()), dueSoonDays: DASHBOARD_DUE_SOON_DAYS, items };
}
