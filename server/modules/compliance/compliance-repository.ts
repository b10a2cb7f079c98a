import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import { readings } from '../../db/schema/surveys';
import { coefficientSets, probes } from '../../db/schema/calibration';
import type { SurveyRow } from '../surveys/surveys-service';
import { currentReadingConditions } from '../surveys/surveys-service';
import { resolveZoneTarget } from '../targets/targets-service';
import type { JudgePlannedGrid, JudgeReading, JudgeSurfacePoint, JudgeZone } from './judge-zones';
import { plannedPoints, readingPlacements, surveyGrids } from '../../db/schema/grids';
import { gridDiffersFromGenerated } from '@shared/spatial/measurement-grid';

export type PlanWithZones = { planId: number; planName: string; zones: JudgeZone[] };

/** Every plan of the site with its zones and the target each is judged against. */
export function loadSitePlans(db: Db, organizationId: number, siteId: number): PlanWithZones[] {
  const planRows = db.select().from(plans).where(eq(plans.siteId, siteId)).orderBy(asc(plans.id)).all();
  if (planRows.length === 0) return [];
  const zoneRows = db.select().from(zones).where(inArray(zones.planId, planRows.map((p) => p.id))).orderBy(asc(zones.id)).all();
  return planRows.map((p) => ({
    planId: p.id,
    planName: p.name,
    zones: zoneRows.filter((z) => z.planId === p.id).map((z): JudgeZone => {
      const t = resolveZoneTarget(db, organizationId, z);
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

/** The survey's current readings (active decode, accepted imports), in time order. */
export function loadCurrentReadings(db: Db, survey: Pick<SurveyRow, 'id' | 'activeDecodeId'>): JudgeReading[] {
  if (survey.activeDecodeId === null) return [];
  return db.select(readingColumns).from(readings).where(and(...currentReadingConditions(survey))).orderBy(asc(readings.timeMs), asc(readings.id)).all();
}

/** Readings by id within one survey (a frozen sign-off names the readings it judged), in time order. */
export function loadReadingsById(db: Db, surveyId: number, ids: number[]): JudgeReading[] {
  if (ids.length === 0) return [];
  // One statement for any number of ids: they travel as one JSON parameter (SQLite's json_each).
  return db.select(readingColumns).from(readings)
    .where(and(eq(readings.surveyId, surveyId), sql`${readings.id} in (select value from json_each(${JSON.stringify(ids)}))`))
    .orderBy(asc(readings.timeMs), asc(readings.id)).all();
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
export function loadPlannedGrids(db: Db, surveyId: number): { workingPlane: Map<number, JudgePlannedGrid>; surfacePoints: Map<number, JudgeSurfacePoint[]> } {
  const grids = db.select().from(surveyGrids).where(eq(surveyGrids.surveyId, surveyId)).all();
  const workingPlane = new Map<number, JudgePlannedGrid>();
  const surfacePoints = new Map<number, JudgeSurfacePoint[]>();
  if (grids.length === 0) return { workingPlane, surfacePoints };
  const points = db.select().from(plannedPoints).where(eq(plannedPoints.surveyId, surveyId)).orderBy(asc(plannedPoints.id)).all();
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
