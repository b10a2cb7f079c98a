import { and, asc, eq, isNotNull, isNull, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import { readings, surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { probes } from '../../db/schema/calibration';
import type { SessionUser } from '@shared/schemas/auth';
import type { MapReading, MapZoneSummary, SurveyMapResponse } from '@shared/schemas/plans';
import type { BudgetPart, Reading } from '@shared/core/types';
import { COVERAGE_K } from '@shared/core/uncertainty';
import { zoneStats } from '@shared/core/zone-stats';
import { createZoneAssigner } from '@shared/spatial/zone-assignment';
import { notFound, unprocessable } from '../../http/errors';
import { siteScope } from '../users/users-service';
import { findVisiblePlan, planExtent } from './plans-service';
import { currentReadingConditions } from '../surveys/surveys-service';
import { decodeBudget } from '../readings/stored-budget.mjs';

/** Plan coordinates may sit this far outside the plan's edge (a point on the outer wall). */
const EDGE_TOLERANCE_M = 0.05;

function findVisibleSurvey(db: Db, user: SessionUser, surveyId: number) {
  const survey = db.select().from(surveys).where(and(eq(surveys.id, surveyId), eq(surveys.organizationId, user.organizationId))).get();
  const scope = siteScope(db, user);
  if (!survey || (scope && !scope.includes(survey.siteId))) throw notFound('Survey');
  return survey;
}

/**
 * The survey's current readings taken on this plan (readings.planId, from the log's plan column
 * or the upload's choice) that have a position, each with its zone and
 * wall-band mark (shared/spatial), and each zone's average over the points its statistics
 * use (task points outside the wall band; shared/core zoneStats). Positioned readings that name
 * no plan are counted, never guessed onto one.
 */
export function surveyMap(db: Db, user: SessionUser, surveyId: number, planId: number | undefined): SurveyMapResponse {
  const survey = findVisibleSurvey(db, user, surveyId);
  let plan;
  if (planId !== undefined) {
    plan = findVisiblePlan(db, user, planId);
    if (plan.siteId !== survey.siteId) throw unprocessable(`Plan ${planId} belongs to another site than survey "${survey.name}"`);
  } else {
    plan = db.select().from(plans).where(eq(plans.siteId, survey.siteId)).orderBy(asc(plans.id)).get();
    if (!plan) throw notFound('A plan of this survey\'s site');
  }
  const siteTimeZone = db.select({ timeZone: sites.timeZone }).from(sites).where(eq(sites.id, survey.siteId)).get()?.timeZone ?? 'UTC';
  const base = { surveyId, surveyName: survey.name, siteId: survey.siteId, siteTimeZone, planId: plan.id };
  const extent = planExtent(plan);
  // Readings of imports still running (or rejected) are not shown: only accepted files count.
  const current = and(...currentReadingConditions(survey));
  const count = (where: ReturnType<typeof and>) => db.select({ n: sql<number>`count(*)` }).from(readings).where(and(current, where)).get()!.n;
  const withoutPosition = survey.activeDecodeId === null ? 0 : count(isNull(readings.xM));
  const withoutPlan = survey.activeDecodeId === null ? 0 : count(and(isNotNull(readings.xM), isNull(readings.planId)));
  const rows = survey.activeDecodeId === null ? [] : db.select({
    id: readings.id, point: readings.point, xM: readings.xM, yM: readings.yM, role: readings.role, lux: readings.lux, uLux: readings.uLux,
    luxBound: readings.luxBound, flag: readings.flag, timeMs: readings.timeMs, gainCode: readings.gainCode, budget: readings.budget,
    probe: probes.serial,
  }).from(readings).innerJoin(probes, eq(probes.id, readings.probeId))
    .where(and(current, eq(readings.planId, plan.id), isNotNull(readings.xM), isNotNull(readings.yM)))
    .orderBy(asc(readings.timeMs), asc(readings.id)).all();

  const placed = rows;
  if (!extent) {
    return { ...base, readings: [], zones: [], withoutPosition, withoutPlan, outsidePlan: placed.length, notice: 'Set the plan\'s scale to place the readings on it.' };
  }
  const onPlan = placed.filter((r) => r.xM! >= -EDGE_TOLERANCE_M && r.yM! >= -EDGE_TOLERANCE_M && r.xM! <= extent.widthM + EDGE_TOLERANCE_M && r.yM! <= extent.heightM + EDGE_TOLERANCE_M);

  const zoneRows = db.select({ id: zones.id, kind: zones.kind, wallBandM: zones.wallBandM, polygon: zones.polygon }).from(zones).where(eq(zones.planId, plan.id)).all();
  const assign = createZoneAssigner(zoneRows);
  const mapReadings: MapReading[] = onPlan.map((r) => {
    // Reference probes stand outdoors for daylight: they belong to no zone.
    const a = r.role === 'task' ? assign([r.xM!, r.yM!]) : { zoneId: null, inWallBand: false };
    return {
      id: r.id, point: r.point, xM: r.xM!, yM: r.yM!, role: r.role, lux: r.lux, uLux: r.uLux, luxBound: r.luxBound, flag: r.flag,
      timestamp: new Date(r.timeMs).toISOString(), probe: r.probe, gainCode: r.gainCode, zoneId: a.zoneId, inWallBand: a.inWallBand,
    };
  });

  const byId = new Map(onPlan.map((r) => [r.id, r]));
  const summaries: MapZoneSummary[] = zoneRows.map((z) => {
    const inZone = mapReadings.filter((r) => r.zoneId === z.id);
    const used = inZone.filter((r) => !r.inWallBand);
    const stats = zoneStats(used.map((r) => asCoreReading(r, decodeBudget(byId.get(r.id)?.budget))));
    return {
      zoneId: z.id, points: used.length, wallBandPoints: inZone.length - used.length,
      eavg: stats.eavg, eavgBound: stats.bounded.eavg, uEavg: stats.uEavg,
    };
  });

  return { ...base, readings: mapReadings, zones: summaries, withoutPosition, withoutPlan, outsidePlan: placed.length - onPlan.length, notice: null };
}

/** The stored reading in the core's shape, for zoneStats (uRel is U / (k * E) by definition of U). */
function asCoreReading(r: MapReading, budget: BudgetPart[]): Reading {
  return {
    probe: r.probe, point: r.point, timeMs: Date.parse(r.timestamp), lux: r.lux, luxBound: r.luxBound, flag: r.flag, flags: [r.flag],
    gainCode: r.gainCode, samples: 1, chosenSample: null, rejected: [],
    uRel: r.lux && r.uLux ? r.uLux / (COVERAGE_K * r.lux) : 0, uLux: r.uLux ?? 0, budget, coefficientSetId: null,
  };
}
