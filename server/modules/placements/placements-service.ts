import { and, asc, eq, isNull, or, sql } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { plans } from '../../db/schema/plans';
import { readings } from '../../db/schema/surveys';
import { probes } from '../../db/schema/calibration';
import { plannedPoints, readingPlacements } from '../../db/schema/grids';
import type { SessionUser } from '@shared/schemas/auth';
import type { ExclusionBody, PlacementBody, PlacementResult, UnplacedResponse } from '@shared/schemas/planned-points';
import { notFound, unprocessable } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { currentReadingConditions, getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { planExtent } from '../plans/plans-service';
import { computeTask, INLINE_READINGS, runComputeBySize } from '../../compute/compute-pool';
import { keptReadingTotal } from '../surveys/reading-counts';
import { assertSurveyEditable } from '../planned-points/planned-points-service';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type ReadingRow = typeof readings.$inferSelect;

/** At most this many unplaced readings are listed (the total says how many there are). */
const UNPLACED_LIMIT = 2000;

/** Task readings of the current decode without a place on a plan (no position, or a position on no plan), grouped by label in time order. */
function queryUnplaced(db: Db, survey: { id: number; activeDecodeId: number | null }): UnplacedResponse {
  if (survey.activeDecodeId === null) return { total: 0, groups: [] };
  const where = and(...currentReadingConditions(survey), eq(readings.role, 'task'), or(isNull(readings.xM), isNull(readings.planId)));
  const total = db.select({ n: sql<number>`count(*)` }).from(readings).where(where).get()!.n;
  const rows = db.select({ r: readings, serial: probes.serial }).from(readings).innerJoin(probes, eq(probes.id, readings.probeId)).where(where)
    .orderBy(asc(readings.point), asc(readings.timeMs), asc(readings.id)).limit(UNPLACED_LIMIT).all();
  const groups = new Map<string, UnplacedResponse['groups'][number]>();
  for (const { r, serial } of rows) {
    let g = groups.get(r.point);
    if (!g) groups.set(r.point, (g = { point: r.point, readings: [] }));
    g.readings.push({ id: r.id, point: r.point, timestamp: new Date(r.timeMs).toISOString(), probe: serial, role: r.role, lux: r.lux, uLux: r.uLux, luxBound: r.luxBound, flag: r.flag });
  }
  return { total, groups: [...groups.values()] };
}

/** Declared in server/modules.ts (placements): finding a large survey's unplaced readings reads every reading, so on a compute thread. */
export const unplacedTask = computeTask('unplaced-readings', queryUnplaced);

export function listUnplaced(db: Db, user: SessionUser, surveyId: number, inlineUpTo = INLINE_READINGS): Promise<UnplacedResponse> {
  const survey = getSurveyRow(db, user, surveyId);
  return runComputeBySize(db, keptReadingTotal(db, survey.id), unplacedTask, { id: survey.id, activeDecodeId: survey.activeDecodeId }, inlineUpTo);
}

function currentReading(db: Db, survey: SurveyRow, readingId: number): ReadingRow {
  const r = survey.activeDecodeId === null ? undefined : db.select().from(readings).where(and(eq(readings.id, readingId), ...currentReadingConditions(survey))).get();
  if (!r) throw notFound('Reading');
  return r;
}

const keyOf = (r: Pick<ReadingRow, 'surveyId' | 'point' | 'probeId' | 'timeMs'>) =>
  and(eq(readingPlacements.surveyId, r.surveyId), eq(readingPlacements.point, r.point), eq(readingPlacements.probeId, r.probeId), eq(readingPlacements.timeMs, r.timeMs));

/** The readings of one decode that a placement's key names (the log's point label, probe and time). */
const readingsOfKey = (decodeId: number, r: Pick<ReadingRow, 'surveyId' | 'point' | 'probeId' | 'timeMs'>) =>
  and(eq(readings.decodeId, decodeId), eq(readings.surveyId, r.surveyId), eq(readings.point, r.point), eq(readings.probeId, r.probeId), eq(readings.timeMs, r.timeMs));

const fmt = (v: number) => (Math.round(v * 100) / 100).toString();

function present(r: ReadingRow, p: typeof readingPlacements.$inferSelect | undefined): PlacementResult {
  return { readingId: r.id, point: r.point, planId: r.planId, xM: r.xM, yM: r.yM, plannedPointId: p?.plannedPointId ?? null, excludedReason: r.excludedReason };
}

/**
 * Places a reading by hand (on a plan, or on a planned point), moves it, or takes its position
 * away. Moving or unplacing a reading that has a position needs a reason. The placement is kept
 * by the log's point label, probe and time, so every later decode gets it again.
 */
export function placeReading(deps: Deps, user: SessionUser, surveyId: number, readingId: number, body: PlacementBody): PlacementResult {
  const survey = getSurveyRow(deps.db, user, surveyId);
  assertSurveyEditable(survey, 'the placement of its readings');
  const reading = currentReading(deps.db, survey, readingId);
  let target: { planId: number | null; xM: number | null; yM: number | null; plannedPointId: number | null; state: 'placed' | 'unplaced' };
  if ('unplace' in body) {
    target = { planId: null, xM: null, yM: null, plannedPointId: null, state: 'unplaced' };
  } else if ('plannedPointId' in body) {
    const p = deps.db.select().from(plannedPoints).where(and(eq(plannedPoints.id, body.plannedPointId), eq(plannedPoints.surveyId, survey.id))).get();
    if (!p) throw notFound('Planned point');
    target = { planId: p.planId, xM: p.xM, yM: p.yM, plannedPointId: p.id, state: 'placed' };
  } else {
    const plan = deps.db.select().from(plans).where(eq(plans.id, body.planId)).get();
    if (!plan || plan.siteId !== survey.siteId) throw notFound('Plan');
    const extent = planExtent(plan);
    if (!extent) throw unprocessable(`Plan "${plan.name}" has no scale yet: set its scale before placing readings on it`);
    if (body.xM < 0 || body.yM < 0 || body.xM > extent.widthM || body.yM > extent.heightM) {
      throw unprocessable(`(${fmt(body.xM)}, ${fmt(body.yM)}) m lies outside plan "${plan.name}" (0 to ${fmt(extent.widthM)} m across, 0 to ${fmt(extent.heightM)} m up)`);
    }
    target = { planId: plan.id, xM: body.xM, yM: body.yM, plannedPointId: null, state: 'placed' };
  }
  const hadPlace = reading.xM !== null && reading.planId !== null;
  if (hadPlace && !body.reason) {
    throw unprocessable(`Reading ${reading.point} already has a place on a plan: give a reason to ${target.state === 'unplaced' ? 'unplace' : 'move'} it (field "reason")`, { field: 'reason' });
  }
  const now = deps.clock.now();
  const action = target.state === 'unplaced' ? 'reading_unplaced' : hadPlace ? 'reading_moved' : 'reading_placed';
  deps.db.transaction((tx) => {
    const existing = tx.select().from(readingPlacements).where(keyOf(reading)).get();
    const values = { state: target.state, planId: target.planId, xM: target.xM, yM: target.yM, plannedPointId: target.plannedPointId, placeReason: body.reason ?? null, updatedBy: user.id, updatedAt: now };
    if (existing) tx.update(readingPlacements).set(values).where(eq(readingPlacements.id, existing.id)).run();
    else tx.insert(readingPlacements).values({ surveyId: survey.id, point: reading.point, probeId: reading.probeId, timeMs: reading.timeMs, excludedReason: null, ...values }).run();
    tx.update(readings).set({ planId: target.planId, xM: target.xM, yM: target.yM }).where(readingsOfKey(survey.activeDecodeId!, reading)).run();
    recordAudit(tx, {
      organizationId: user.organizationId, actorId: user.id, entityType: 'reading', entityId: reading.id, surveyId: survey.id, action,
      before: { point: reading.point, time: new Date(reading.timeMs).toISOString(), planId: reading.planId, xM: reading.xM, yM: reading.yM },
      after: { planId: target.planId, xM: target.xM, yM: target.yM, plannedPointId: target.plannedPointId, reason: body.reason ?? null },
      at: now,
    });
  });
  const after = currentReading(deps.db, survey, readingId);
  return present(after, deps.db.select().from(readingPlacements).where(keyOf(reading)).get());
}

/** Excludes one reading from its zone's statistics with a reason (or includes it again); audited and kept across decodes. */
export function setExclusion(deps: Deps, user: SessionUser, surveyId: number, readingId: number, body: ExclusionBody): PlacementResult {
  const survey = getSurveyRow(deps.db, user, surveyId);
  assertSurveyEditable(survey, 'the exclusion of its readings');
  const reading = currentReading(deps.db, survey, readingId);
  const reason = body.excluded ? body.reason : null;
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    const existing = tx.select().from(readingPlacements).where(keyOf(reading)).get();
    if (existing) tx.update(readingPlacements).set({ excludedReason: reason, updatedBy: user.id, updatedAt: now }).where(eq(readingPlacements.id, existing.id)).run();
    else tx.insert(readingPlacements).values({ surveyId: survey.id, point: reading.point, probeId: reading.probeId, timeMs: reading.timeMs, state: 'as_logged', excludedReason: reason, updatedBy: user.id, updatedAt: now }).run();
    tx.update(readings).set({ excludedReason: reason }).where(readingsOfKey(survey.activeDecodeId!, reading)).run();
    recordAudit(tx, {
      organizationId: user.organizationId, actorId: user.id, entityType: 'reading', entityId: reading.id, surveyId: survey.id, action: body.excluded ? 'reading_excluded' : 'reading_included',
      before: { point: reading.point, time: new Date(reading.timeMs).toISOString(), excludedReason: reading.excludedReason }, after: { excludedReason: reason, reason: body.reason ?? null }, at: now,
    });
  });
  const after = currentReading(deps.db, survey, readingId);
  return present(after, deps.db.select().from(readingPlacements).where(keyOf(reading)).get());
}

/** Applies every kept placement and exclusion of a survey to the readings of a decode (after a re-decode); returns how many readings it changed. */
export function applyPlacements(tx: Tx | Db, surveyId: number, decodeId: number): number {
  const rows = tx.select().from(readingPlacements).where(eq(readingPlacements.surveyId, surveyId)).all();
  let changed = 0;
  for (const p of rows) {
    const set = p.state === 'as_logged' ? { excludedReason: p.excludedReason } : { planId: p.planId, xM: p.xM, yM: p.yM, excludedReason: p.excludedReason };
    changed += tx.update(readings).set(set).where(readingsOfKey(decodeId, p)).run().changes;
  }
  return changed;
}
