import { min } from 'simple-statistics';
// Emergency lighting test schedule and the passes of a survey. Pure; dates are ISO calendar
// dates (YYYY-MM-DD) in the site's time zone, times epoch milliseconds.
import type { EmergencyPass } from './emergency';

export const EMERGENCY_TEST_KINDS = ['functional', 'full_duration'] as const;
export type EmergencyTestKind = (typeof EMERGENCY_TEST_KINDS)[number];
export const EMERGENCY_TEST_RESULTS = ['pass', 'fail'] as const;
export type EmergencyTestResult = (typeof EMERGENCY_TEST_RESULTS)[number];
/** A test reminder's reason: due within the warning window, or past due. Stored codes. */
export const TEST_REMINDER_STATES = ['due_soon', 'overdue'] as const;

/**
 * How often each test is due. Defaults: a functional test every 30 days and a full-duration
 * test every 12 months (NFPA 101 §7.9.3, as quoted in secondary sources; EN 50172 / BS 5266-1
 * ask monthly and annual tests: from memory). An organisation may set its own intervals.
 */
export interface TestSchedule { functionalEveryDays: number; fullDurationEveryMonths: number }
export const DEFAULT_TEST_SCHEDULE: TestSchedule = { functionalEveryDays: 30, fullDurationEveryMonths: 12 };

export interface LogbookEntryLike { kind: EmergencyTestKind; testedOn: string; result: EmergencyTestResult }

export interface TestDue {
  kind: EmergencyTestKind;
  /** The latest test that counts for this kind, or null. */
  lastTestedOn: string | null;
  lastResult: EmergencyTestResult | null;
  /** Due date, or null when no test was ever recorded (due now). */
  dueOn: string | null;
  state: 'ok' | 'due_soon' | 'overdue' | 'never_tested';
  /** Days past the due date (0 if not overdue). */
  daysOverdue: number;
}

const DAY_MS = 86_400_000;

function parseDate(d: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(d);
  if (!m) throw new RangeError(`Not a calendar date: ${d}`);
  return Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
}
const fmtDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

export function addDays(date: string, days: number): string {
  return fmtDate(parseDate(date) + days * DAY_MS);
}

/** Calendar months; a day that the target month lacks becomes its last day (31 Jan + 1 month = 28/29 Feb). */
export function addMonths(date: string, months: number): string {
  const t = new Date(parseDate(date));
  const y = t.getUTCFullYear();
  const m = t.getUTCMonth() + months;
  const last = new Date(Date.UTC(y, m + 1, 0)).getUTCDate();
  return fmtDate(Date.UTC(y, m, Math.min(t.getUTCDate(), last)));
}

export function daysBetween(from: string, to: string): number {
  return Math.round((parseDate(to) - parseDate(from)) / DAY_MS);
}

/** Days before the due date at which a test shows as due soon (project's choice). */
export const DUE_SOON_DAYS = 7;

/**
 * Next due date of each test kind from the logbook. A full-duration test also exercises the
 * change-over, so it counts as a functional test too (common practice). The latest test counts
 * whatever its result: a failed test is shown as such, with its failed fittings, not hidden by the schedule.
 */
export function testDueDates(entries: readonly LogbookEntryLike[], schedule: TestSchedule, today: string): TestDue[] {
  return (['functional', 'full_duration'] as const).map((kind) => {
    const counting = entries.filter((e) => (kind === 'functional' ? true : e.kind === 'full_duration'));
    const last = counting.reduce<LogbookEntryLike | null>((a, e) => (a === null || e.testedOn > a.testedOn ? e : a), null);
    if (!last) return { kind, lastTestedOn: null, lastResult: null, dueOn: null, state: 'never_tested', daysOverdue: 0 };
    const dueOn = kind === 'functional' ? addDays(last.testedOn, schedule.functionalEveryDays) : addMonths(last.testedOn, schedule.fullDurationEveryMonths);
    const late = daysBetween(dueOn, today);
    const state = late > 0 ? 'overdue' : late > -DUE_SOON_DAYS ? 'due_soon' : 'ok';
    return { kind, lastTestedOn: last.testedOn, lastResult: last.result, dueOn, state, daysOverdue: Math.max(0, late) };
  });
}

/**
 * The pass of a reading taken at timeMs, from when the mains failed and the rated duration:
 * before the mains failed it belongs to no pass (normal lighting may have been on); in the
 * first half of the rated duration it is the initial pass; from then on the end-of-duration
 * pass (the levels fall as the battery discharges, so the later half stands for the end).
 */
export function passOfReading(timeMs: number, mainsOffMs: number, ratedDurationMin: number): EmergencyPass | null {
  if (timeMs < mainsOffMs) return null;
  return timeMs < mainsOffMs + (ratedDurationMin * 60_000) / 2 ? 'initial' : 'end_of_duration';
}

/**
 * The pass of a reading when its log may say which pass it belongs to: the log's pass if the
 * surveyor gave one, else by time (passOfReading). A reading taken before the mains failed
 * belongs to no pass either way: the normal lighting may have been on.
 */
export function passOfLoggedReading(timeMs: number, mainsOffMs: number, ratedDurationMin: number, logPass: EmergencyPass | null): EmergencyPass | null {
  if (timeMs < mainsOffMs) return null;
  return logPass ?? passOfReading(timeMs, mainsOffMs, ratedDurationMin);
}

/** Readings of the end pass taken this long before the rated duration ends are flagged (project's choice: 15 min). */
export const END_PASS_EARLY_MIN = 15;

/** Warnings about when the passes were taken relative to the mains failing. */
export function passTimingWarnings(passTimes: { pass: EmergencyPass; timeMs: number }[], mainsOffMs: number, ratedDurationMin: number): string[] {
  const out: string[] = [];
  const end = passTimes.filter((p) => p.pass === 'end_of_duration').map((p) => p.timeMs);
  if (end.length) {
    const first = min(end);
    const early = (mainsOffMs + ratedDurationMin * 60_000 - first) / 60_000;
    if (early > END_PASS_EARLY_MIN) out.push(`The end-of-duration pass began ${Math.round(early)} min before the rated duration of ${ratedDurationMin} min ended: its levels may be higher than at the end.`);
  }
  return out;
}
