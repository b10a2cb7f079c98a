import { and, asc, desc, eq, lt, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { decodes, readings } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { coefficientSets, probes } from '../../db/schema/calibration';
import { users } from '../../db/schema/organizations';
import { createCoefficientSelector } from '@shared/core/coefficient-sets';
import type { SessionUser } from '@shared/schemas/auth';
import type { DecodeChanges, DecodedValue } from '@shared/schemas/readings';
import { currentReadingConditions, getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { loadDecodingCalibration } from '../probes/probe-calibration';

/** At most this many changed readings are listed (the total is always given). */
export const DECODE_CHANGES_LIMIT = 2000;

/**
 * Whether the survey's current decode used, for every reading, the approved set in force at its
 * time now: then a re-decode would change nothing. Readings are grouped by probe and set; a group
 * is current when that set is the one selected at both its first and its last reading (no other
 * set can take over in between without being selected at the last).
 */
export function decodedWithCurrentSets(db: Db, organizationId: number, survey: Pick<SurveyRow, 'id' | 'activeDecodeId'>): boolean {
  if (survey.activeDecodeId === null) return true;
  const groups = db.select({ probeId: readings.probeId, setId: readings.coefficientSetId, first: sql<number>`min(${readings.timeMs})`, last: sql<number>`max(${readings.timeMs})` })
    .from(readings).where(and(...currentReadingConditions(survey))).groupBy(readings.probeId, readings.coefficientSetId).all();
  if (groups.length === 0) return true;
  const calibration = loadDecodingCalibration(db, organizationId);
  const byProbe = new Map([...calibration.values()].map((c) => [c.probeId, createCoefficientSelector(c.sets)]));
  return groups.every((g) => {
    const selector = byProbe.get(g.probeId);
    const want = g.setId === null ? null : String(g.setId);
    return selector !== undefined && (selector.select(g.first)?.id ?? null) === want && (selector.select(g.last)?.id ?? null) === want;
  });
}

type Row = { id: number; point: string; timeMs: number; probe: string; lux: number | null; uLux: number | null; luxBound: 'exact' | 'lower' | 'upper'; flag: string; setId: number | null; setVersion: number | null };

const loadDecode = (db: Db, surveyId: number, decodeId: number): Row[] => db.select({
  id: readings.id, point: readings.point, timeMs: readings.timeMs, probe: probes.serial, lux: readings.lux, uLux: readings.uLux, luxBound: readings.luxBound, flag: readings.flag,
  setId: readings.coefficientSetId, setVersion: coefficientSets.version,
}).from(readings).innerJoin(probes, eq(probes.id, readings.probeId)).leftJoin(coefficientSets, eq(coefficientSets.id, readings.coefficientSetId))
  .where(and(eq(readings.surveyId, surveyId), eq(readings.decodeId, decodeId))).orderBy(asc(readings.importId), asc(readings.id)).all();

const valueOf = (r: Row): DecodedValue => ({ lux: r.lux, uLux: r.uLux, luxBound: r.luxBound, flag: r.flag as DecodedValue['flag'], coefficientSetId: r.setId, coefficientSetVersion: r.setVersion });
const same = (a: Row, b: Row) => a.lux === b.lux && a.uLux === b.uLux && a.luxBound === b.luxBound && a.flag === b.flag && a.setId === b.setId;

/**
 * What the latest re-decode changed: the readings of the active decode beside the same readings
 * of the decode before it (the n-th reading of each import in both, since a re-decode reads the same
 * kept samples in the same order), listing only those whose value, uncertainty, bound, flag or set differ.
 */
export function decodeChanges(db: Db, user: SessionUser, surveyId: number): DecodeChanges {
  const survey = getSurveyRow(db, user, surveyId);
  const site = db.select({ timeZone: sites.timeZone }).from(sites).where(eq(sites.id, survey.siteId)).get();
  const describe = (id: number) => {
    const d = db.select({ d: decodes, name: users.name }).from(decodes).leftJoin(users, eq(users.id, decodes.createdBy)).where(eq(decodes.id, id)).get()!;
    return { decodeId: d.d.id, reason: d.d.reason, createdAt: new Date(d.d.createdAt).toISOString(), createdByName: d.name };
  };
  const base = { surveyId: survey.id, surveyName: survey.name, siteName: survey.site.name, siteTimeZone: site?.timeZone ?? 'UTC', status: survey.status,
    decodedWithCurrentSets: decodedWithCurrentSets(db, user.organizationId, survey) };
  if (survey.activeDecodeId === null) return { ...base, before: null, after: null, compared: 0, changedTotal: 0, changes: [] };
  const previous = db.select({ id: decodes.id }).from(decodes).where(and(eq(decodes.surveyId, survey.id), lt(decodes.id, survey.activeDecodeId))).orderBy(desc(decodes.id)).get();
  const after = describe(survey.activeDecodeId);
  if (!previous) return { ...base, before: null, after, compared: 0, changedTotal: 0, changes: [] };
  const a = loadDecode(db, survey.id, previous.id);
  const b = loadDecode(db, survey.id, survey.activeDecodeId);
  const n = Math.min(a.length, b.length);
  const changes: DecodeChanges['changes'] = [];
  let changedTotal = 0;
  for (let i = 0; i < n; i++) {
    if (same(a[i], b[i])) continue;
    changedTotal++;
    if (changes.length < DECODE_CHANGES_LIMIT) {
      changes.push({ readingId: b[i].id, point: b[i].point, timestamp: new Date(b[i].timeMs).toISOString(), probe: b[i].probe, before: valueOf(a[i]), after: valueOf(b[i]) });
    }
  }
  return { ...base, before: describe(previous.id), after, compared: n, changedTotal, changes };
}
