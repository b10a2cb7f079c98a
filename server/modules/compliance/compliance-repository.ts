import { and, asc, between, eq, inArray, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import { readings } from '../../db/schema/surveys';
import { coefficientSets, probes } from '../../db/schema/calibration';
import type { SurveyRow } from '../surveys/surveys-service';
import { currentReadingConditions } from '../surveys/surveys-service';
import { resolveZoneTargets, type TargetRow } from '../targets/targets-service';
import type { JudgePlannedGrid, JudgeReading, JudgeSurfacePoint, JudgeZone } from './judge-zones';
import { plannedPoints, readingPlacements, surveyGrids } from '../../db/schema/grids';
import { gridDiffersFromGenerated } from '@shared/spatial/measurement-grid';

export type PlanWithZones = { planId: number; planName: string; zones: JudgeZone[] };

/** Every plan of the site with its zones and the target each is judged against. */
export function loadSitePlans(db: Db, organizationId: number, siteId: number): PlanWithZones[] {
  const planRows = db.select().from(plans).where(eq(plans.siteId, siteId)).orderBy(asc(plans.id)).all();
  if (planRows.length === 0) return [];
  const zoneRows = db.select().from(zones).where(inArray(zones.planId, planRows.map((p) => p.id))).orderBy(asc(zones.id)).all();
  return sitePlansOf(planRows, zoneRows, resolveZoneTargets(db, organizationId, zoneRows));
}

/** Plans with their zones (rows in id order) and each zone's resolved target (in the zones' order). */
export function sitePlansOf(planRows: readonly (typeof plans.$inferSelect)[], zoneRows: readonly (typeof zones.$inferSelect)[], targetsOfZones: readonly (TargetRow | undefined)[]): PlanWithZones[] {
  const resolved = new Map(targetsOfZones.map((t, i) => [zoneRows[i].id, t]));
  return planRows.map((p) => ({
    planId: p.id,
    planName: p.name,
    zones: zoneRows.filter((z) => z.planId === p.id).map((z): JudgeZone => {
      const t = resolved.get(z.id);
      return {
        id: z.id, name: z.name, kind: z.kind, useType: z.useType, planId: p.id, planName: p.name, planeHeightM: z.planeHeightM, wallBandM: z.wallBandM,
        polygon: z.polygon, chosenEmLux: z.chosenEmLux, contextModifiers: z.contextModifiers,
        target: t ? {
          id: t.id, name: t.name, emLux: t.emLux, u0Min: t.u0Min, dfTargetPercent: t.dfTargetPercent, source: t.source, confidence: t.confidence,
          emModifiedLux: t.emModifiedLux, ezLux: t.ezLux, emWallLux: t.emWallLux, emCeilingLux: t.emCeilingLux, ra: t.ra, rugl: t.rugl,
        } : null,
      };
    }),
  }));
}

const readingColumns = {
  id: readings.id, point: readings.point, xM: readings.xM, yM: readings.yM, planId: readings.planId, role: readings.role, timeMs: readings.timeMs, probeId: readings.probeId,
  lux: readings.lux, uLux: readings.uLux, luxBound: readings.luxBound, flag: readings.flag, budget: readings.budget, coefficientSetId: readings.coefficientSetId,
  plane: readings.plane, azimuthDeg: readings.azimuthDeg,
  excludedReason: readings.excludedReason,
  note: readings.note,
};

/** One string for each repeated text (SQLite hands every row its own copy of 'task', 'exact', 'ok'). */
function sameTexts() {
  const texts = new Map<string, string>();
  return (t: string) => { const kept = texts.get(t); if (kept !== undefined) return kept; texts.set(t, t); return t; };
}

/** The same columns, in this order, with the budget as its stored text (parsed once per distinct text, below). */
const judgeColumns = { ...readingColumns, budget: sql<string | null>`${readings.budget}` };
/** Each column's place in a raw row. */
const AT = Object.fromEntries(Object.keys(judgeColumns).map((k, i) => [k, i])) as Record<keyof typeof judgeColumns, number>;

/**
 * The survey's current readings (active decode, accepted imports), in time order.
 * A survey can hold 500,000 of them on a compute thread, so each is kept small: rows are read one
 * at a time (no second copy of every row as drizzle's .all() makes), repeated texts (role, bound,
 * flag, plane) are one string each, and readings with the same stored budget share one parsed
 * budget (a log's readings mostly have a handful). Read-only: judging never changes them.
 */
export function loadCurrentReadings(db: Db, survey: Pick<SurveyRow, 'id' | 'activeDecodeId'>): JudgeReading[] {
  if (survey.activeDecodeId === null) return [];
  return judgeReadingsOf(db, db.select(judgeColumns).from(readings).where(and(...currentReadingConditions(survey))).orderBy(asc(readings.timeMs), asc(readings.id)).toSQL());
}

/** Readings by id within one survey (a frozen sign-off names the readings it judged; a zone's detail), in time order, kept small as above. */
export function loadReadingsById(db: Db, surveyId: number, ids: number[]): JudgeReading[] {
  if (ids.length === 0) return [];
  // One statement for any number of ids: they travel as one JSON parameter (SQLite's json_each).
  return judgeReadingsOf(db, db.select(judgeColumns).from(readings)
    .where(and(eq(readings.surveyId, surveyId), sql`${readings.id} in (select value from json_each(${JSON.stringify(ids)}))`))
    .orderBy(asc(readings.timeMs), asc(readings.id)).toSQL());
}

/** Runs a select of judgeColumns row by row into small JudgeReadings (shared texts and parsed budgets). */
function judgeReadingsOf(db: Db, query: { sql: string; params: unknown[] }): JudgeReading[] {
  const toReading = judgeReadingOfRow();
  const out: JudgeReading[] = [];
  for (const row of db.$client.prepare(query.sql).raw().iterate(...query.params) as IterableIterator<unknown[]>) out.push(toReading(row));
  return out;
}

/** A raw row of judgeColumns as a small JudgeReading: repeated texts shared, each distinct budget parsed once. */
function judgeReadingOfRow(): (row: unknown[]) => JudgeReading {
  const same = sameTexts();
  const budgets = new Map<string, unknown>();
  const budgetOf = (stored: string | null) => {
    if (stored === null) return null;
    let parsed = budgets.get(stored);
    if (parsed === undefined) budgets.set(stored, (parsed = JSON.parse(stored) as unknown));
    return parsed;
  };
  return (row) => ({
    id: row[AT.id] as number, point: row[AT.point] as string, xM: row[AT.xM] as number | null, yM: row[AT.yM] as number | null, planId: row[AT.planId] as number | null,
    role: same(row[AT.role] as string) as JudgeReading['role'], timeMs: row[AT.timeMs] as number, probeId: row[AT.probeId] as number,
    lux: row[AT.lux] as number | null, uLux: row[AT.uLux] as number | null, luxBound: same(row[AT.luxBound] as string) as JudgeReading['luxBound'],
    flag: same(row[AT.flag] as string) as JudgeReading['flag'], budget: budgetOf(row[AT.budget] as string | null), coefficientSetId: row[AT.coefficientSetId] as number | null,
    plane: same(row[AT.plane] as string) as JudgeReading['plane'], azimuthDeg: row[AT.azimuthDeg] as number | null,
    excludedReason: row[AT.excludedReason] as string | null, note: row[AT.note] as string | null,
  });
}

/** What the report draws and dates of a reading (and the field conditions' notes read): no budget or probe. */
export type ReadingPoint = Pick<JudgeReading, 'id' | 'point' | 'xM' | 'yM' | 'role' | 'timeMs' | 'lux' | 'luxBound' | 'note'>;

/**
 * Readings of one survey for several groups of ids at once (the report: each zone's readings and
 * its wall band), each group in time order. The report holds them all while it renders (500,000
 * on a large survey), so each is a small object; and they are read in one pass over the ids'
 * range in id order (about 1 s for 500,000), where a lookup per id cost 40 queries of random reads.
 */
export function loadReadingPointGroups(db: Db, surveyId: number, groups: readonly (readonly number[])[]): ReadingPoint[][] {
  return loadReportPointGroups(db, surveyId, groups, () => true).map((g) => g.points!);
}

/**
 * A group's readings as columns: what a drawing of merged dots needs (report-pdf.ts), at about a
 * sixth of the memory of ReadingPoint objects (each of those holds boxed numbers and its own label).
 */
export type PointColumns = { count: number; xM: Float64Array; yM: Float64Array; lux: Float64Array; latestMs: number };
const ABSENT = Number.NaN;

/**
 * As loadReadingPointGroups, each group kept either as ReadingPoints (`asPoints(i)`) or as
 * PointColumns (NaN for a missing position or value), in the same one pass.
 */
export function loadReportPointGroups(db: Db, surveyId: number, groups: readonly (readonly number[])[], asPoints: (group: number) => boolean): { points: ReadingPoint[] | null; columns: PointColumns | null }[] {
  const same = sameTexts();
  const out = groups.map((g, i) => (asPoints(i)
    ? { points: [] as ReadingPoint[], columns: null }
    : { points: null, columns: { count: 0, xM: new Float64Array(g.length), yM: new Float64Array(g.length), lux: new Float64Array(g.length), latestMs: -Infinity } }));
  readGroups(db, surveyId, groups, {
    id: readings.id, point: readings.point, xM: readings.xM, yM: readings.yM, role: readings.role, timeMs: readings.timeMs, lux: readings.lux, luxBound: readings.luxBound, note: readings.note,
  }, ([id, point, xM, yM, role, timeMs, lux, luxBound, note], inGroups) => {
    // A reading in two groups kept as points is one object.
    let r: ReadingPoint | undefined;
    for (const i of inGroups) {
      const { points, columns: c } = out[i];
      if (points) {
        r ??= {
          id: id as number, point: point as string, xM: xM as number | null, yM: yM as number | null, role: same(role as string) as ReadingPoint['role'], timeMs: timeMs as number,
          lux: lux as number | null, luxBound: same(luxBound as string) as ReadingPoint['luxBound'], note: note as string | null,
        };
        points.push(r);
      } else if (c) {
        c.xM[c.count] = (xM as number | null) ?? ABSENT;
        c.yM[c.count] = (yM as number | null) ?? ABSENT;
        c.lux[c.count] = (lux as number | null) ?? ABSENT;
        if ((timeMs as number) > c.latestMs) c.latestMs = timeMs as number;
        c.count++;
      }
    }
  });
  // Rows came in id order: a stable sort by time gives (time, id) order, as the readings' own order.
  for (const g of out) g.points?.sort((a, b) => a.timeMs - b.timeMs || a.id - b.id);
  return out;
}

/** As loadReadingPointGroups, whole JudgeReadings (every zone's points built in one pass, answer-parts.ts). */
export function loadReadingGroups(db: Db, surveyId: number, groups: readonly (readonly number[])[]): JudgeReading[][] {
  const out = groups.map((): JudgeReading[] => []);
  const toReading = judgeReadingOfRow();
  readGroups(db, surveyId, groups, judgeColumns, (row, inGroups) => {
    // A reading in two groups is one object.
    const r = toReading(row);
    for (const i of inGroups) out[i].push(r);
  });
  for (const list of out) list.sort((a, b) => a.timeMs - b.timeMs || a.id - b.id);
  return out;
}

/**
 * One pass over the groups' id range (columns begin with the id), in id order: each row named by a
 * group is handed over once, with the groups naming it (an array reused from row to row).
 */
function readGroups(db: Db, surveyId: number, groups: readonly (readonly number[])[], columns: Parameters<Db['select']>[0] & object, add: (row: unknown[], inGroups: readonly number[]) => void): void {
  let lo = Infinity;
  let hi = -Infinity;
  let total = 0;
  for (const g of groups) for (const id of g) { if (id < lo) lo = id; if (id > hi) hi = id; total++; }
  if (total === 0) return;
  // The groups each id belongs to: by offset from the smallest id while the ids are dense (a survey's readings are), else by map.
  const dense = hi - lo < 4 * total + 100_000;
  const first = dense ? new Int32Array(hi - lo + 1) : null;
  const sparse = new Map<number, number[]>();
  groups.forEach((g, i) => {
    for (const id of g) {
      if (first && first[id - lo] === 0) first[id - lo] = i + 1;
      else sparse.set(id, [...(sparse.get(id) ?? []), i]);
    }
  });
  const query = db.select(columns).from(readings).where(and(eq(readings.surveyId, surveyId), between(readings.id, lo, hi))).toSQL();
  const inGroups: number[] = [];
  for (const row of db.$client.prepare(query.sql).raw().iterate(...query.params) as IterableIterator<unknown[]>) {
    const id = row[0] as number;
    const at = first ? first[id - lo] - 1 : -1;
    inGroups.length = 0;
    if (at >= 0) inGroups.push(at);
    for (const i of sparse.get(id) ?? []) inGroups.push(i);
    if (inGroups.length > 0) add(row, inGroups);
  }
}

export type UsedCoefficientSet = {
  id: number; probeId: number; probeSerial: string; probeKind: string; probeDescription: string; version: number; status: string;
  effectiveFrom: number; dueDate: number; certificateNumber: string; tRefMs: number; alphaPerK: number; tCalC: number;
  gains: { code: number; darkCounts: number; luxPerCount: number; uRel: number }[]; readings: number;
  /** A transmitter's signal range and accuracy (absent for counting probes and in sign-offs frozen before it was kept). */
  analog?: { rangeLowLux: number; rangeHighLux: number; scale: 'linear' | 'log10'; accuracyPercent: number };
};

/** The coefficient sets (and their probes) of the given [set id, readings] counts. */
export function loadUsedCoefficientSets(db: Db, readingsPerSet: [number, number][]): UsedCoefficientSet[] {
  const counts = new Map(readingsPerSet);
  if (counts.size === 0) return [];
  return db.select({ set: coefficientSets, probe: probes }).from(coefficientSets).innerJoin(probes, eq(probes.id, coefficientSets.probeId))
    .where(inArray(coefficientSets.id, [...counts.keys()])).orderBy(asc(probes.serial), asc(coefficientSets.version)).all()
    .map(({ set, probe }) => ({
      id: set.id, probeId: probe.id, probeSerial: probe.serial, probeKind: probe.kind, probeDescription: probe.description, version: set.version, status: set.status,
      effectiveFrom: set.effectiveFrom, dueDate: set.dueDate, certificateNumber: set.certificateNumber, tRefMs: set.tRefMs, alphaPerK: set.alphaPerK, tCalC: set.tCalC,
      gains: set.gains.map((g) => ({ code: g.code, darkCounts: g.darkCounts, luxPerCount: g.luxPerCount, uRel: g.uRel })), readings: counts.get(set.id) ?? 0,
      ...(probe.kind !== 'counts' && probe.rangeLowLux !== null && probe.rangeHighLux !== null
        ? { analog: { rangeLowLux: probe.rangeLowLux, rangeHighLux: probe.rangeHighLux, scale: probe.scale ?? 'linear', accuracyPercent: probe.accuracyPercent ?? 0 } }
        : {}),
    }));
}

/**
 * The survey's planned grids by zone, as the verdicts use them: the working plane's grid (changed:
 * differs from the generated grid) and the planned points on walls and ceilings.
 */
export type PlannedGrids = { workingPlane: Map<number, JudgePlannedGrid>; surfacePoints: Map<number, JudgeSurfacePoint[]> };
export function loadPlannedGrids(db: Db, surveyId: number): PlannedGrids {
  const grids = db.select().from(surveyGrids).where(eq(surveyGrids.surveyId, surveyId)).all();
  if (grids.length === 0) return plannedGridsOf([], []);
  return plannedGridsOf(grids, db.select().from(plannedPoints).where(eq(plannedPoints.surveyId, surveyId)).orderBy(asc(plannedPoints.id)).all());
}

/** loadPlannedGrids from the survey's grid rows and its planned point rows (in id order). */
export function plannedGridsOf(grids: readonly (typeof surveyGrids.$inferSelect)[], points: readonly (typeof plannedPoints.$inferSelect)[]): PlannedGrids {
  const workingPlane = new Map<number, JudgePlannedGrid>();
  const surfacePoints = new Map<number, JudgeSurfacePoint[]>();
  for (const g of grids) {
    const own = points.filter((p) => p.gridId === g.id);
    if (g.surface === 'working_plane') {
      workingPlane.set(g.zoneId, { layout: g.layout, changed: gridDiffersFromGenerated(g.generated, own), reason: g.reason, points: own.map((p) => ({ id: p.id, label: p.label })) });
    } else {
      const list = surfacePoints.get(g.zoneId) ?? [];
      for (const p of own) if (p.plane === 'wall' || p.plane === 'ceiling') list.push({ id: p.id, label: p.label, plane: p.plane });
      surfacePoints.set(g.zoneId, list);
    }
  }
  return { workingPlane, surfacePoints };
}

export const placementKey = (point: string, probeId: number, timeMs: number) => `${probeId}\u0000${timeMs}\u0000${point}`;

/** Readings placed by hand on a planned point, keyed like the placements themselves (point label, probe, time). */
export function loadPlacementsOnPlannedPoints(db: Db, surveyId: number): Map<string, number> {
  const rows = db.select({ point: readingPlacements.point, probeId: readingPlacements.probeId, timeMs: readingPlacements.timeMs, id: readingPlacements.plannedPointId }).from(readingPlacements)
    .where(and(eq(readingPlacements.surveyId, surveyId), eq(readingPlacements.state, 'placed'))).all();
  return new Map(rows.filter((r) => r.id !== null).map((r) => [placementKey(r.point, r.probeId, r.timeMs), r.id!]));
}
