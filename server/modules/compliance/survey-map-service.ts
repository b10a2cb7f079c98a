import { and, asc, eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import { readings, surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { probes } from '../../db/schema/calibration';
import type { SessionUser } from '@shared/schemas/auth';
import type { MapReading, MapZoneSummary, SurveyMapResponse } from '@shared/schemas/plans';
import { createZoneAssigner } from '@shared/spatial/zone-assignment';
import { notFound, unprocessable } from '../../http/errors';
import { siteScope } from '../users/users-service';
import { findVisiblePlan, planExtent } from '../plans/plans-service';
import { currentAggregate } from './verdict-aggregates';

function findVisibleSurvey(db: Db, user: SessionUser, surveyId: number) {
  const survey = db.select().from(surveys).where(and(eq(surveys.id, surveyId), eq(surveys.organizationId, user.organizationId))).get();
  const scope = siteScope(db, user);
  if (!survey || (scope && !scope.includes(survey.siteId))) throw notFound('Survey');
  return survey;
}

/**
 * The survey's current readings taken on this plan (readings.planId, from the log's plan column
 * or the upload's choice) that have a position, each with its zone and wall-band mark
 * (shared/spatial), and each zone's average from the survey's verdict aggregate (the same figures
 * as the verdicts). Above MAP_MAX_POINTS readings on the plan, an even sample in time order is
 * drawn and `sampledFrom` says of how many. Positioned readings that name no plan are counted,
 * never guessed onto one.
 */
export async function surveyMap(db: Db, user: SessionUser, surveyId: number, planId: number | undefined): Promise<SurveyMapResponse> {
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
  const { summary } = await currentAggregate(db, survey);
  const { withoutPosition, withoutPlan } = summary.map;
  const onThisPlan = summary.map.plans.find((p) => p.planId === plan.id) ?? { onPlan: 0, outsidePlan: 0, sampleIds: [] };
  if (!planExtent(plan)) {
    return { ...base, readings: [], zones: [], withoutPosition, withoutPlan, outsidePlan: onThisPlan.outsidePlan, sampledFrom: null, notice: 'Set the plan\'s scale to place the readings on it.' };
  }
  const rows = onThisPlan.sampleIds.length === 0 ? [] : db.select({
    id: readings.id, point: readings.point, xM: readings.xM, yM: readings.yM, role: readings.role, lux: readings.lux, uLux: readings.uLux,
    luxBound: readings.luxBound, flag: readings.flag, timeMs: readings.timeMs, gainCode: readings.gainCode, probe: probes.serial,
  }).from(readings).innerJoin(probes, eq(probes.id, readings.probeId))
    .where(and(eq(readings.surveyId, survey.id), sql`${readings.id} in (select value from json_each(${JSON.stringify(onThisPlan.sampleIds)}))`))
    .orderBy(asc(readings.timeMs), asc(readings.id)).all();

  const zoneRows = db.select({ id: zones.id, kind: zones.kind, wallBandM: zones.wallBandM, polygon: zones.polygon }).from(zones).where(eq(zones.planId, plan.id)).all();
  const assign = createZoneAssigner(zoneRows);
  const mapReadings: MapReading[] = rows.map((r) => {
    // Reference probes stand outdoors for daylight: they belong to no zone.
    const a = r.role === 'task' ? assign([r.xM!, r.yM!]) : { zoneId: null, inWallBand: false };
    return {
      id: r.id, point: r.point, xM: r.xM!, yM: r.yM!, role: r.role, lux: r.lux, uLux: r.uLux, luxBound: r.luxBound, flag: r.flag,
      timestamp: new Date(r.timeMs).toISOString(), probe: r.probe, gainCode: r.gainCode, zoneId: a.zoneId, inWallBand: a.inWallBand,
    };
  });
  const judged = new Map(summary.zones.map((z) => [z.zoneId, z]));
  const summaries: MapZoneSummary[] = zoneRows.map((z) => {
    const j = judged.get(z.id);
    return { zoneId: z.id, points: j?.points ?? 0, wallBandPoints: j?.wallBandPoints ?? 0, eavg: j?.eavg ?? null, eavgBound: j ? j.bounds.eavg : 'indeterminate', uEavg: j?.uEavg ?? null };
  });
  return {
    ...base, readings: mapReadings, zones: summaries, withoutPosition, withoutPlan, outsidePlan: onThisPlan.outsidePlan,
    sampledFrom: onThisPlan.onPlan > onThisPlan.sampleIds.length ? onThisPlan.onPlan : null, notice: null,
  };
}
