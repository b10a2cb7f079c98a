import { and, eq, isNotNull, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { logImports, readings } from '../../db/schema/surveys';
import { computeTask, runCompute } from '../../compute/compute-pool';
import { currentReadingConditions } from '../surveys/surveys-service';

/**
 * Page marks: in a large survey, the time and id of every PAGE_MARK_STRIDE-th current reading in
 * the readings table's time order (ascending, and descending with ties by id), so a page at any
 * offset starts with one index seek from the nearest mark instead of an OFFSET walking every
 * reading before it. Marks are computed on a compute thread, once per set of current readings
 * (readingSetVersion), and kept in this process; a page asked for meanwhile waits for them.
 */
export const PAGE_MARK_STRIDE = 1024;
export type PageOrder = 'asc' | 'desc';
type MarkSurvey = { id: number; activeDecodeId: number | null };
type Marks = { version: string; marks: Float64Array };

/** Per database connection (tests open many), per survey and order; a few bytes per thousand readings. */
const kept = new WeakMap<object, Map<string, Marks>>();
const KEPT_PER_DATABASE = 256;

/**
 * Names the set of current readings: the active decode, its accepted imports, and its field
 * readings (count, last and sum of ids, through their partial index). Readings only enter or
 * leave the current set through these, so an unchanged version means unchanged marks.
 */
export function readingSetVersion(db: Db, survey: MarkSurvey): string {
  const imports = db.select({ ids: sql<string | null>`group_concat(${logImports.id})` }).from(logImports)
    .where(and(eq(logImports.surveyId, survey.id), eq(logImports.status, 'done'))).get()?.ids ?? '';
  const field = db.select({ n: sql<number>`count(*)`, last: sql<number | null>`max(${readings.id})`, sum: sql<number | null>`sum(${readings.id})` }).from(readings)
    .where(and(isNotNull(readings.fieldRecordId), eq(readings.decodeId, survey.activeDecodeId ?? -1))).get()!;
  return `${survey.activeDecodeId}|${imports}|${field.n}|${field.last}|${field.sum}`;
}

/** The compute task: the version and the marks, read in one snapshot (a window over the time index). */
function computeMarks(db: Db, input: { survey: MarkSurvey; order: PageOrder }): Marks {
  return db.$client.transaction(() => {
    const version = readingSetVersion(db, input.survey);
    const order = input.order === 'desc' ? sql`${readings.timeMs} desc, ${readings.id} asc` : sql`${readings.timeMs} asc, ${readings.id} asc`;
    const inner = db.select({ timeMs: readings.timeMs, id: readings.id, n: sql<number>`row_number() over (order by ${order}) - 1`.as('n') })
      .from(readings).where(and(...currentReadingConditions(input.survey))).as('ordered');
    const rows = db.select({ timeMs: inner.timeMs, id: inner.id }).from(inner).where(sql`${inner.n} % ${PAGE_MARK_STRIDE} = 0`).orderBy(sql`${inner.n}`).all();
    const marks = new Float64Array(rows.length * 2);
    rows.forEach((r, i) => { marks[2 * i] = r.timeMs; marks[2 * i + 1] = r.id; });
    return { version, marks };
  }).deferred();
}

/**
 * Declared in server/modules.ts (readings). It reads every current reading (SQLite's window, small
 * in memory), so it runs with the other whole-survey tasks rather than queuing behind zone answers.
 */
export const pageMarksTask = computeTask('reading-page-marks', computeMarks, { wholeSurvey: true });

const keptOf = (db: Db) => {
  let perDb = kept.get(db.$client);
  if (!perDb) kept.set(db.$client, perDb = new Map());
  return perDb;
};

/** The kept marks of the survey's current readings in this order, or null when none are kept for them. */
export function keptPageMarks(db: Db, survey: MarkSurvey, order: PageOrder): Float64Array | null {
  const found = keptOf(db).get(`${survey.id}:${order}`);
  return found && found.version === readingSetVersion(db, survey) ? found.marks : null;
}

/**
 * Where a page at `offset` starts: the nearest mark at or before it and how many readings to skip
 * from there; null for a survey without current readings. Marks not yet kept for the current
 * readings are computed first (one run shared by everyone asking meanwhile).
 */
export async function pageMark(db: Db, survey: MarkSurvey, order: PageOrder, offset: number): Promise<{ timeMs: number; id: number; skip: number } | null> {
  let marks = keptPageMarks(db, survey, order);
  if (!marks) {
    const computed = await runCompute(db, pageMarksTask, { survey: { id: survey.id, activeDecodeId: survey.activeDecodeId }, order });
    const store = keptOf(db);
    const key = `${survey.id}:${order}`;
    if (store.size >= KEPT_PER_DATABASE && !store.has(key)) store.delete(store.keys().next().value!);
    store.set(key, computed);
    marks = computed.marks;
  }
  const count = marks.length / 2;
  if (count === 0) return null;
  const i = Math.min(Math.floor(offset / PAGE_MARK_STRIDE), count - 1);
  return { timeMs: marks[2 * i], id: marks[2 * i + 1], skip: offset - i * PAGE_MARK_STRIDE };
}
