import { createCoefficientSelector, isCalibrationLapsed } from '@shared/core/coefficient-sets';
import type { CoefficientSet } from '@shared/core/types';
import type { CalibrationState } from '@shared/schemas/probes';

export const DAY_MS = 86_400_000;

export type CalibrationStatus = {
  /** The approved set in force at `now` (shared/core selection), or null. */
  current: CoefficientSet | null;
  state: CalibrationState;
  /** Whole days from now to the due date, rounded down (negative: overdue). */
  daysUntilDue: number | null;
};

/** A probe's calibration state at `now`, from its approved sets; "due soon" means within dueSoonDays. */
export function calibrationStatus(approvedSets: readonly CoefficientSet[], now: number, dueSoonDays: number): CalibrationStatus {
  const current = createCoefficientSelector(approvedSets).select(now);
  if (!current) return { current: null, state: 'no_approved_set', daysUntilDue: null };
  if (current.dueDate === null) return { current, state: 'ok', daysUntilDue: null };
  const daysUntilDue = Math.floor((current.dueDate - now) / DAY_MS);
  if (isCalibrationLapsed(current, now)) return { current, state: 'overdue', daysUntilDue };
  return { current, state: current.dueDate - now <= dueSoonDays * DAY_MS ? 'due_soon' : 'ok', daysUntilDue };
}
