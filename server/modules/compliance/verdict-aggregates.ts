import { createHash } from 'node:crypto';
import { and, asc, eq, inArray, isNotNull, isNull, or, sql } from 'drizzle-orm';
import { oncePerConnection, type Db } from '../../db/client';
import { logImports, surveys } from '../../db/schema/surveys';
import { plans as plansTable, zones as zonesTable } from '../../db/schema/plans';
import { verdictAggregateZones, verdictAggregates } from '../../db/schema/aggregates';
import type { AcceptanceRule } from '@shared/core/decision';
import { computeTask, runCompute } from '../../compute/compute-pool';
import { installationOf, type SurveyRow } from '../surveys/surveys-service';
import type { Installation } from '@shared/core/maintained';
import type { InstallationInfo } from '@shared/schemas/surveys';
import { readingPlacements, plannedPoints, surveyGrids } from '../../db/schema/grids';
import { fieldRecords, fieldSessions } from '../../db/schema/field';
import { readings as readingsTable } from '../../db/schema/surveys';
import { conditionNotes } from '../field/field-service';
import { loadCurrentReadings, loadPlacementsOnPlannedPoints, placementKey, plannedGridsOf, sitePlansOf, type PlannedGrids, type PlanWithZones } from './compliance-repository';
import { pickZoneTargets } from '../targets/targets-service';
import { targets } from '../../db/schema/targets';
import { organizations } from '../../db/schema/organizations';
import { answerCache } from './answer-cache';
import { judgeZones, worstFirst, type JudgedZone, type JudgeReading, type JudgeResult } from './judge-zones';
import type { GridRounding } from '@shared/core/zone-stats';

/**
 * Per-decode aggregates: a survey's judged zones are computed once for a set of inputs and kept,
 * so verdicts, zone detail, the map, exports and sign-off read them instead of re-judging every
 * reading. The inputs are hashed into a key: the active decode, the accepted imports, the site's
 * plans with their scales, zones and each zone's resolved target, the decision rule, the survey's
 * daylight condition, installation and grid rounding, its planned grids and points, and its hand
 * placements and exclusions (reading_placements: a placement moves a reading, an exclusion takes it
 * out of the statistics, both without a new decode). Anything judgeZones reads belongs in
 * verdictInputs, so changing it changes the key and the next read recomputes (on a compute
 * thread, server/compute/compute-pool.ts).
 */
const AGGREGATE_VERSION = 2;

export type StoredZone = Omit<JudgedZone, 'readingIds' | 'wallBandReadingIds' | 'otherPlaneReadingIds' | 'pointDf'>;
export type AggregateSummary = {
  rule: AcceptanceRule;
  zones: StoredZone[];
  unassignedPoints: number;
  hasDaylightReference: boolean;
  warnings: string[];
  /** Current readings per coefficient set, [set id, readings]. */
  coefficientSetReadings: [number, number][];
  map: MapAggregate;
};

/** Above this many readings on a plan, its map shows an even sample of them (in time order). */
export const MAP_MAX_POINTS = 3000;
/** Plan coordinates may sit this far outside the plan's edge (a point on the outer wall). */
export const EDGE_TOLERANCE_M = 0.05;

/** What the survey map needs beyond the judged zones: counts it reports and each plan's drawn readings. */
export type MapAggregate = {
  withoutPosition: number;
  withoutPlan: number;
  plans: { planId: number; onPlan: number; outsidePlan: number; sampleIds: number[] }[];
};
export type Aggregate = { id: number; inputsKey: string; summary: AggregateSummary };
export type ZoneMembers = { readingIds: number[]; wallBandReadingIds: number[]; otherPlaneReadingIds: number[]; pointDf: Record<string, number> };

type SurveyInputs = Pick<SurveyRow, 'id' | 'organizationId' | 'siteId' | 'activeDecodeId' | 'conditions' | 'installation' | 'maintenanceFactor' | 'mfParts' | 'gridRounding'>;

/** The core's Installation from the stored or frozen one. */
export function coreInstallation(info: InstallationInfo): Installation {
  return info.state === 'new' && info.maintenanceFactor !== null ? { state: 'new', maintenanceFactor: info.maintenanceFactor, parts: info.parts } : { state: 'in_service' };
}

/** What the verdicts of a survey are judged from, and the key naming that set of inputs. */
type PlanExtentRow = { id: number; widthPx: number; heightPx: number; metresPerPixel: number | null };

export type VerdictInputs = {
  key: string; rule: AcceptanceRule; plans: PlanWithZones[]; daylightExcluded: boolean; installation: Installation; extents: PlanExtentRow[];
  gridRounding: GridRounding; plannedGrids: PlannedGrids;
};

export function verdictInputs(db: Db, survey: SurveyInputs): VerdictInputs {
  const q = inputQueries(db);
  const organization = { org: survey.organizationId };
  const rule = q.rule.get(organization)?.decisionRule;
  if (!rule) throw new Error(`Organisation ${survey.organizationId} does not exist`);
  const planRows = q.plans.all({ site: survey.siteId });
  const zoneRows = planRows.length === 0 ? [] : q.zones.all({ site: survey.siteId });
  const plans = sitePlansOf(planRows, zoneRows, pickZoneTargets(zoneRows.length === 0 ? [] : q.targets.all(organization), survey.organizationId, zoneRows));
  const imports = survey.activeDecodeId === null ? [] : q.imports.all({ survey: survey.id }).map((r) => r.id);
  const daylightExcluded = survey.conditions?.daylightExcluded ?? false;
  // New installations are judged against Em / MF.
  const installation = coreInstallation(installationOf(survey));
  // The plans' scales place readings on the map (outside a plan's edge or not).
  const extents = planRows.map((p) => ({ id: p.id, widthPx: p.widthPx, heightPx: p.heightPx, metresPerPixel: p.metresPerPixel }));
  const gridRounding = survey.gridRounding;
  // Planned grids and points as stored (moved points, reasons), and every hand placement or exclusion.
  const grids = q.grids.all({ survey: survey.id });
  const points = q.points.all({ survey: survey.id });
  const plannedGrids = plannedGridsOf(grids, grids.length === 0 ? [] : points);
  const placements = q.placements.all({ survey: survey.id });
  // Field records (a typed reading, or a lights-off reading that turns its pair into E_on - E_off) and
  // the sessions whose conditions warn about readings; the field readings of the decode by their index.
  const field = {
    records: q.fieldRecords.get({ survey: survey.id }),
    sessions: q.fieldSessions.all({ survey: survey.id }),
    readings: survey.activeDecodeId === null ? null : q.fieldReadings.get({ decode: survey.activeDecodeId }),
  };
  const key = createHash('sha256').update(JSON.stringify({ v: AGGREGATE_VERSION, decode: survey.activeDecodeId, imports, rule, daylightExcluded, installation, plans, extents, gridRounding, grids, points, placements, field })).digest('base64url');
  return { key, rule, plans, daylightExcluded, installation, extents, gridRounding, plannedGrids };
}

/**
 * verdictInputs' queries, prepared once per connection: every verdicts, zone and map request runs
 * them, and building and preparing a statement cost more than running it (about 6 ms of the event
 * loop per request at 50 clients, of which well under 1 ms is SQLite's).
 */
const inputQueries = oncePerConnection((db) => {
  const org = sql.placeholder('org');
  const site = sql.placeholder('site');
  const survey = sql.placeholder('survey');
  return {
    rule: db.select({ decisionRule: organizations.decisionRule }).from(organizations).where(eq(organizations.id, org)).prepare(),
    plans: db.select().from(plansTable).where(eq(plansTable.siteId, site)).orderBy(asc(plansTable.id)).prepare(),
    zones: db.select().from(zonesTable).where(inArray(zonesTable.planId, db.select({ id: plansTable.id }).from(plansTable).where(eq(plansTable.siteId, site)))).orderBy(asc(zonesTable.id)).prepare(),
    // Every entry the organisation sees (its own and the shipped ones, a few dozen): pickZoneTargets chooses.
    targets: db.select().from(targets).where(or(isNull(targets.organizationId), eq(targets.organizationId, org))).orderBy(asc(targets.id)).prepare(),
    imports: db.select({ id: logImports.id }).from(logImports).where(and(eq(logImports.surveyId, survey), eq(logImports.status, 'done'))).orderBy(asc(logImports.id)).prepare(),
    grids: db.select().from(surveyGrids).where(eq(surveyGrids.surveyId, survey)).orderBy(asc(surveyGrids.id)).prepare(),
    points: db.select().from(plannedPoints).where(eq(plannedPoints.surveyId, survey)).orderBy(asc(plannedPoints.id)).prepare(),
    placements: db.select({
      id: readingPlacements.id, point: readingPlacements.point, probeId: readingPlacements.probeId, timeMs: readingPlacements.timeMs, state: readingPlacements.state,
      planId: readingPlacements.planId, xM: readingPlacements.xM, yM: readingPlacements.yM, plannedPointId: readingPlacements.plannedPointId,
      excludedReason: readingPlacements.excludedReason, updatedAt: readingPlacements.updatedAt,
    }).from(readingPlacements).where(eq(readingPlacements.surveyId, survey)).orderBy(asc(readingPlacements.id)).prepare(),
    fieldRecords: db.select({ n: sql<number>`count(*)`, last: sql<number | null>`max(${fieldRecords.id})` }).from(fieldRecords).where(eq(fieldRecords.surveyId, survey)).prepare(),
    fieldSessions: db.select().from(fieldSessions).where(eq(fieldSessions.surveyId, survey)).orderBy(asc(fieldSessions.id)).prepare(),
    fieldReadings: db.select({ n: sql<number>`count(*)`, last: sql<number | null>`max(${readingsTable.id})` }).from(readingsTable)
      .where(and(isNotNull(readingsTable.fieldRecordId), eq(readingsTable.decodeId, sql.placeholder('decode')))).prepare(),
  };
});

/** Judges every plan's zones from the survey's current readings (task readings on the plan their log named). */
export function judgeSurvey(survey: Pick<SurveyRow, 'activeDecodeId'>, inputs: Pick<VerdictInputs, 'plans' | 'rule' | 'daylightExcluded' | 'installation' | 'gridRounding' | 'plannedGrids'>, allReadings: JudgeReading[]): JudgeResult {
  const { plans, rule, daylightExcluded, installation, gridRounding, plannedGrids } = inputs;
  // Each task reading is judged on the plan its log named (readings.planId); reference readings pair with every plan.
  const byPlan = new Map<number, JudgeReading[]>(plans.map((p) => [p.planId, []]));
  const reference: JudgeReading[] = [];
  let withoutPlan = 0;
  let task = 0;
  for (const r of allReadings) {
    if (r.role === 'reference') { reference.push(r); continue; }
    task++;
    const list = r.planId === null ? undefined : byPlan.get(r.planId);
    if (list) list.push(r);
    else if (r.xM !== null && plans.length > 0) withoutPlan++;
  }
  const perPlan = plans.map((p) => judgeZones({ zones: p.zones, readings: byPlan.get(p.planId)!.concat(reference), rule, daylightExcluded, installation, gridRounding, plannedGrids: plannedGrids.workingPlane, plannedSurfacePoints: plannedGrids.surfacePoints }));
  const unplaced = plans.length === 0 ? task : withoutPlan;
  const result: JudgeResult = {
    zones: worstFirst(perPlan.flatMap((r) => r.zones)),
    unassignedPoints: perPlan.reduce((n, r) => n + r.unassignedPoints, unplaced),
    hasDaylightReference: reference.some((r) => r.lux !== null),
    warnings: [...new Set(perPlan.flatMap((r) => r.warnings))],
  };
  if (withoutPlan > 0) {
    result.warnings.unshift(`${withoutPlan} task reading(s) have a position but no plan (the log named none and this site has ${plans.length} plans), so they could not be placed in any zone: give logs a plan column, or choose the plan when uploading.`);
  }
  if (plans.length === 0) result.warnings.unshift('This site has no plan with zones yet: draw zones to get verdicts.');
  if (survey.activeDecodeId === null) result.warnings.unshift('This survey has no decoded readings yet.');
  return result;
}

/** Per plan: its positioned readings within (or beyond) its edge and an even sample of at most MAP_MAX_POINTS to draw. */
function mapAggregate(all: JudgeReading[], extents: PlanExtentRow[]): MapAggregate {
  let withoutPosition = 0;
  let withoutPlan = 0;
  // A plan's extent in metres once its scale is set (as plans-service's planExtent; not imported, which would make a circle with plans).
  const byPlan = new Map(extents.map((p) => [p.id, { extent: p.metresPerPixel ? { widthM: p.widthPx * p.metresPerPixel, heightM: p.heightPx * p.metresPerPixel } : null, on: [] as number[], outside: 0 }]));
  for (const r of all) {
    if (r.xM === null) { withoutPosition++; continue; }
    if (r.planId === null) { withoutPlan++; continue; }
    const plan = r.yM === null ? undefined : byPlan.get(r.planId);
    if (!plan) continue;
    const e = plan.extent;
    if (e && r.xM >= -EDGE_TOLERANCE_M && r.yM! >= -EDGE_TOLERANCE_M && r.xM <= e.widthM + EDGE_TOLERANCE_M && r.yM! <= e.heightM + EDGE_TOLERANCE_M) plan.on.push(r.id);
    else plan.outside++;
  }
  return {
    withoutPosition, withoutPlan,
    plans: [...byPlan.entries()].map(([planId, p]) => {
      const step = p.on.length / MAP_MAX_POINTS;
      const sampleIds = step <= 1 ? p.on : Array.from({ length: MAP_MAX_POINTS }, (_, i) => p.on[Math.floor(i * step)]);
      return { planId, onPlan: p.on.length, outsidePlan: p.outside, sampleIds };
    }),
  };
}

const ids = (xs: number[]) => Buffer.from(Float64Array.from(xs).buffer);
const fromIds = (b: Buffer) => Array.from(new Float64Array(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength)));

function aggregateIdOf(db: Db, surveyId: number, key: string): number | null {
  return db.select({ id: verdictAggregates.id }).from(verdictAggregates).where(and(eq(verdictAggregates.surveyId, surveyId), eq(verdictAggregates.inputsKey, key))).get()?.id ?? null;
}

/**
 * The aggregate of these inputs (or of this id), its summary parsed once and kept (answer-cache.ts):
 * a 40-zone summary is about 130 KB of JSON, read on every verdicts, zone and map request.
 */
function findAggregate(db: Db, where: { id: number } | { surveyId: number; key: string }): Aggregate | null {
  const row = db.select({ id: verdictAggregates.id, inputsKey: verdictAggregates.inputsKey, bytes: sql<number>`length(${verdictAggregates.summary})` }).from(verdictAggregates)
    .where('id' in where ? eq(verdictAggregates.id, where.id) : and(eq(verdictAggregates.surveyId, where.surveyId), eq(verdictAggregates.inputsKey, where.key))).get();
  if (!row) return null;
  const cache = answerCache(db);
  const kept = cache.get<AggregateSummary>(row.id, row.inputsKey, 'summary');
  if (kept) return { id: row.id, inputsKey: row.inputsKey, summary: kept };
  const summary = db.select({ summary: verdictAggregates.summary }).from(verdictAggregates).where(eq(verdictAggregates.id, row.id)).get()?.summary as AggregateSummary | undefined;
  if (!summary) return null;
  // Parsed JSON takes about three times its text.
  cache.set(row.id, row.inputsKey, 'summary', summary, row.bytes * 3);
  return { id: row.id, inputsKey: row.inputsKey, summary };
}

/**
 * The compute task: reads the inputs and readings in one snapshot, judges, and keeps the result
 * (replacing the survey's earlier live aggregates; frozen ones stay). Answers the aggregate's id.
 */
function computeAggregate(db: Db, input: { surveyId: number; now: number }): number {
  const snapshot = db.$client.transaction(() => {
    const survey = db.select().from(surveys).where(eq(surveys.id, input.surveyId)).get();
    if (!survey) throw new Error(`Survey ${input.surveyId} does not exist`);
    const inputs = verdictInputs(db, survey);
    const existing = aggregateIdOf(db, survey.id, inputs.key);
    if (existing !== null) return { existing, survey: null } as const;
    const readings = loadCurrentReadings(db, survey);
    // Readings placed by hand on a planned point count for that point (judge-zones.ts).
    const onPlanned = loadPlacementsOnPlannedPoints(db, survey.id);
    if (onPlanned.size > 0) for (const r of readings) r.plannedPointId = onPlanned.get(placementKey(r.point, r.probeId, r.timeMs)) ?? null;
    return { existing: null, survey, inputs, readings } as const;
  }).deferred();
  if (snapshot.existing !== null) return snapshot.existing;
  const { survey, inputs } = snapshot;
  const result = judgeSurvey(survey, inputs, snapshot.readings);
  // Field sessions' conditions (before lights on, warm-up, burn-in, daylight) as warnings.
  for (const w of conditionNotes(db, survey, snapshot.readings)) result.warnings.push(w);
  const perSet = new Map<number, number>();
  for (const r of snapshot.readings) if (r.coefficientSetId !== null) perSet.set(r.coefficientSetId, (perSet.get(r.coefficientSetId) ?? 0) + 1);
  const map = mapAggregate(snapshot.readings, inputs.extents);
  const summary: AggregateSummary = {
    map,
    rule: inputs.rule, unassignedPoints: result.unassignedPoints, hasDaylightReference: result.hasDaylightReference, warnings: result.warnings,
    zones: result.zones.map(({ readingIds: _r, wallBandReadingIds: _w, otherPlaneReadingIds: _o, pointDf: _d, ...zone }) => zone),
    coefficientSetReadings: [...perSet.entries()].sort((a, b) => a[0] - b[0]),
  };
  return db.$client.transaction(() => {
    const found = aggregateIdOf(db, survey.id, inputs.key);
    if (found !== null) return found;
    const stale = db.select({ id: verdictAggregates.id }).from(verdictAggregates).where(and(eq(verdictAggregates.surveyId, survey.id), eq(verdictAggregates.frozen, false))).all();
    for (const s of stale) {
      db.delete(verdictAggregateZones).where(eq(verdictAggregateZones.aggregateId, s.id)).run();
      db.delete(verdictAggregates).where(eq(verdictAggregates.id, s.id)).run();
    }
    const id = db.insert(verdictAggregates).values({ surveyId: survey.id, inputsKey: inputs.key, summary, createdAt: input.now }).returning({ id: verdictAggregates.id }).get()!.id;
    for (const z of result.zones) {
      const df = Object.entries(z.pointDf ?? {}).flatMap(([readingId, percent]) => [Number(readingId), percent]);
      db.insert(verdictAggregateZones).values({ aggregateId: id, zoneId: z.zoneId, readingIds: ids(z.readingIds), wallBandReadingIds: ids(z.wallBandReadingIds), otherPlaneReadingIds: ids(z.otherPlaneReadingIds ?? []), pointDf: ids(df) }).run();
    }
    return id;
  }).immediate();
}

/** Declared in server/modules.ts (compliance), so the pool threads can run it. */
export const verdictAggregateTask = computeTask('verdict-aggregate', computeAggregate, { wholeSurvey: true });

/** The survey's aggregate for its current inputs: kept, or computed now off the request's thread. */
export async function currentAggregate(db: Db, survey: SurveyInputs, now = Date.now()): Promise<Aggregate> {
  for (let attempt = 0; ; attempt++) {
    const found = findAggregate(db, { surveyId: survey.id, key: verdictInputs(db, survey).key });
    if (found) return keptAsLive(db, survey.id, found);
    const id = await runCompute(db, verdictAggregateTask, { surveyId: survey.id, now });
    // The inputs changed while it ran: the newer aggregate is the answer; if it was already replaced, compute again.
    const computed = findAggregate(db, { id });
    if (computed || attempt >= 2) {
      if (!computed) throw new Error(`The verdicts of survey ${survey.id} kept changing while they were computed`);
      return keptAsLive(db, survey.id, computed);
    }
  }
}

/** Each survey's live aggregate as last answered on this connection, so what was kept for the one it replaced is dropped. */
const liveAggregates = new WeakMap<object, Map<number, number>>();
function keptAsLive(db: Db, surveyId: number, aggregate: Aggregate): Aggregate {
  let live = liveAggregates.get(db.$client);
  if (!live) liveAggregates.set(db.$client, (live = new Map()));
  const before = live.get(surveyId);
  if (before !== undefined && before !== aggregate.id) answerCache(db).forgetAggregate(before);
  live.set(surveyId, aggregate.id);
  return aggregate;
}

/** Keeps an aggregate for good (a sign-off froze it); call inside the sign-off's transaction. */
export function freezeAggregate(db: Pick<Db, 'update'>, aggregateId: number): boolean {
  return db.update(verdictAggregates).set({ frozen: true }).where(eq(verdictAggregates.id, aggregateId)).run().changes === 1;
}

/** The readings one judged zone used, its wall-band readings and its points' daylight factors. */
export function aggregateZoneMembers(db: Db, aggregateId: number, zoneId: number): ZoneMembers {
  const row = db.select().from(verdictAggregateZones).where(and(eq(verdictAggregateZones.aggregateId, aggregateId), eq(verdictAggregateZones.zoneId, zoneId))).get();
  if (!row) return { readingIds: [], wallBandReadingIds: [], otherPlaneReadingIds: [], pointDf: {} };
  const df = fromIds(row.pointDf);
  const pointDf: Record<string, number> = {};
  for (let i = 0; i < df.length; i += 2) pointDf[df[i]] = df[i + 1];
  return { readingIds: fromIds(row.readingIds), wallBandReadingIds: fromIds(row.wallBandReadingIds), otherPlaneReadingIds: fromIds(row.otherPlaneReadingIds), pointDf };
}
