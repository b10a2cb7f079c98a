import { asc, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { coefficientSets, probes } from '../../db/schema/calibration';
import { createCoefficientSelector, isCalibrationLapsed } from '@shared/core/coefficient-sets';
import type { CoefficientSet } from '@shared/core/types';
import type { CalibrationState } from '@shared/schemas/probes';
import { toCoreCoefficientSet } from './probe-calibration';
import { calendarDaysBetween } from '@shared/datetime';


export type CalibrationStatus = {
  /** The approved set in force at `now` (shared/core selection), or null. */
  current: CoefficientSet | null;
  state: CalibrationState;
  /** Calendar days (UTC) from today to the due day: 0 on the due day, negative once overdue. */
  daysUntilDue: number | null;
};

/** A probe's calibration state at `now`, from its approved sets; "due soon" means within dueSoonDays. */
export function calibrationStatus(approvedSets: readonly CoefficientSet[], now: number, dueSoonDays: number): CalibrationStatus {
  const current = createCoefficientSelector(approvedSets).select(now);
  if (!current) return { current: null, state: 'no_approved_set', daysUntilDue: null };
  if (current.dueDate === null) return { current, state: 'ok', daysUntilDue: null };
  const daysUntilDue = calendarDaysBetween(now, current.dueDate);
  if (isCalibrationLapsed(current, now)) return { current, state: 'overdue', daysUntilDue };
  return { current, state: daysUntilDue <= dueSoonDays ? 'due_soon' : 'ok', daysUntilDue };
}

type ProbeRow = typeof probes.$inferSelect;
type SetRow = typeof coefficientSets.$inferSelect;

export type ProbeCalibrationRow = { probe: ProbeRow; sets: SetRow[]; status: ReturnType<typeof calibrationStatus>; current: SetRow | null };

/** Each probe with its sets and its calibration state at the clock's now (shared/core selection). */
export function probesWithCalibration(deps: Deps, probeRows: ProbeRow[], dueSoonDays: number): ProbeCalibrationRow[] {
  if (probeRows.length === 0) return [];
  const sets = deps.db.select().from(coefficientSets).where(inArray(coefficientSets.probeId, probeRows.map((p) => p.id)))
    .orderBy(asc(coefficientSets.effectiveFrom), asc(coefficientSets.version)).all();
  const now = deps.clock.now();
  return probeRows.map((probe) => {
    const mine = sets.filter((s) => s.probeId === probe.id);
    const status = calibrationStatus(mine.filter((s) => s.status === 'approved').map(toCoreCoefficientSet), now, dueSoonDays);
    return { probe, sets: mine, status, current: status.current ? mine.find((s) => String(s.id) === status.current!.id)! : null };
  });
}
