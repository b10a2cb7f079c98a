import { and, eq } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { SessionUser } from '@shared/schemas/auth';
import type { ProbeSurvey } from '@shared/schemas/probes';
import { createCoefficientSelector } from '@shared/core/coefficient-sets';
import { probes } from '../../db/schema/calibration';
import { readings, surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { notFound } from '../../http/errors';
import { surveyAbilities } from '@shared/survey-abilities';
import { loadDecodingCalibration } from './probe-calibration';

/**
 * The surveys whose current decode holds readings of this probe, with how many of those
 * readings were decoded with a set other than the approved set in force at their time now
 * (after a corrected set is approved): the surveys a re-decode would change.
 */
export function surveysDecodedWithProbe(deps: Deps, user: SessionUser, probeId: number): ProbeSurvey[] {
  const probe = deps.db.select().from(probes).where(and(eq(probes.id, probeId), eq(probes.organizationId, user.organizationId))).get();
  if (!probe) throw notFound('Probe');
  const sets = loadDecodingCalibration(deps.db, user.organizationId, { probeId }).get(probe.serial)?.sets ?? [];
  const selector = createCoefficientSelector(sets);
  const rows = deps.db.select({ surveyId: surveys.id, name: surveys.name, status: surveys.status, submittedBy: surveys.submittedBy, siteName: sites.name, timeMs: readings.timeMs, setId: readings.coefficientSetId })
    .from(readings)
    .innerJoin(surveys, and(eq(surveys.id, readings.surveyId), eq(readings.decodeId, surveys.activeDecodeId)))
    .innerJoin(sites, eq(sites.id, surveys.siteId))
    .where(and(eq(readings.probeId, probeId), eq(surveys.organizationId, user.organizationId)))
    .all();
  const bySurvey = new Map<number, ProbeSurvey>();
  for (const r of rows) {
    let s = bySurvey.get(r.surveyId);
    if (!s) bySurvey.set(r.surveyId, (s = { surveyId: r.surveyId, name: r.name, siteName: r.siteName, status: r.status, readings: 0, staleReadings: 0, canRedecode: surveyAbilities(user, r).redecode }));
    s.readings++;
    const inForce = selector.select(r.timeMs);
    if ((inForce?.id ?? null) !== (r.setId === null ? null : String(r.setId))) s.staleReadings++;
  }
  return [...bySurvey.values()].sort((a, b) => b.staleReadings - a.staleReadings || a.name.localeCompare(b.name));
}
