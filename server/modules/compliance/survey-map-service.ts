import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import { surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { probes } from '../../db/schema/calibration';
import type { SessionUser } from '@shared/schemas/auth';
import type { MapZoneSummary, SurveyMapResponse } from '@shared/schemas/plans';
import { notFound, unprocessable } from '../../http/errors';
import { siteScope } from '../users/users-service';
import { findVisiblePlan, planExtent } from '../plans/plans-service';
import { currentAggregate, type Aggregate } from './verdict-aggregates';
import { keptMapReadings, mapReadingsTask, rememberMapReadings, type MapReadingsPart } from './answer-parts';
import { runCompute } from '../../compute/compute-pool';
import { packedAnswer, type PackedAnswer } from '../../http/packed-json';

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
export async function surveyMap(db: Db, user: SessionUser, surveyId: number, planId: number | undefined): Promise<SurveyMapResponse | PackedAnswer<SurveyMapResponse>> {
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
  for (let attempt = 0; ; attempt++) {
    const aggregate = await currentAggregate(db, survey);
    const { summary } = aggregate;
    const { withoutPosition, withoutPlan } = summary.map;
    const onThisPlan = summary.map.plans.find((p) => p.planId === plan.id) ?? { onPlan: 0, outsidePlan: 0, sampleIds: [] };
    if (!planExtent(plan)) {
      return { ...base, readings: [], zones: [], withoutPosition, withoutPlan, outsidePlan: onThisPlan.outsidePlan, sampledFrom: null, notice: 'Set the plan\'s scale to place the readings on it.' };
    }
    const part = await mapReadingsOf(db, survey.id, aggregate, plan.id);
    // The aggregate was replaced while its sample was read: ask again (as currentAggregate does).
    if (!part) {
      if (attempt >= 2) throw new Error(`The verdicts of survey ${survey.id} kept changing while its map was read`);
      continue;
    }
    const zoneIds = db.select({ id: zones.id }).from(zones).where(eq(zones.planId, plan.id)).all();
    const judged = new Map(summary.zones.map((z) => [z.zoneId, z]));
    const summaries: MapZoneSummary[] = zoneIds.map((z) => {
      const j = judged.get(z.id);
      return { zoneId: z.id, points: j?.points ?? 0, wallBandPoints: j?.wallBandPoints ?? 0, eavg: j?.eavg ?? null, eavgBound: j ? j.bounds.eavg : 'indeterminate', uEavg: j?.uEavg ?? null };
    });
    return packedAnswer(part.readings, {
      ...base, zones: summaries, withoutPosition, withoutPlan, outsidePlan: onThisPlan.outsidePlan,
      sampledFrom: onThisPlan.onPlan > onThisPlan.sampleIds.length ? onThisPlan.onPlan : null, notice: null,
    });
  }
}

/**
 * A plan's packed readings for the aggregate: kept, else built on a compute thread (null: that
 * aggregate is gone). Probe serials are no input of the verdicts, so a kept part whose probes were
 * renamed since is built again.
 */
async function mapReadingsOf(db: Db, surveyId: number, aggregate: Aggregate, planId: number): Promise<MapReadingsPart | null> {
  const kept = keptMapReadings(db, aggregate.id, planId);
  if (kept && serialsStill(db, kept.probes)) return kept;
  const built = await runCompute(db, mapReadingsTask, { surveyId, aggregateId: aggregate.id, planId });
  if (built) rememberMapReadings(db, aggregate.id, planId, built);
  return built;
}

function serialsStill(db: Db, kept: [number, string][]): boolean {
  if (kept.length === 0) return true;
  const now = new Map(db.select({ id: probes.id, serial: probes.serial }).from(probes).where(inArray(probes.id, kept.map(([id]) => id))).all().map((p) => [p.id, p.serial]));
  return kept.every(([id, serial]) => now.get(id) === serial);
}
