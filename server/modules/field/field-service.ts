import { and, asc, desc, eq, inArray, isNotNull, lte } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { decodes, readings, surveys } from '../../db/schema/surveys';
import { probes } from '../../db/schema/calibration';
import { plans, zones } from '../../db/schema/plans';
import { sites } from '../../db/schema/sites';
import { plannedPoints } from '../../db/schema/grids';

import { fieldPhotos, fieldRecords, fieldSessions } from '../../db/schema/field';
import type { SessionUser } from '@shared/schemas/auth';
import { WORKED_ON_STATUSES } from '@shared/survey-abilities';
import { fieldRecordBodySchema, fieldSessionBodySchema, type FieldPhoto, type FieldRecord, type FieldRecordBody, type FieldSession, type FieldSessionBody, type FieldState, type ZoneNote } from '@shared/schemas/field';
import { typedReading, type ManualMeter } from '@shared/core/typed-readings';
import { MAX_PAIR_GAP_MS, pairedSubtraction } from '@shared/core/paired-daylight';
import { conditionWarnings, WARM_UP_MS, type SessionConditions } from '@shared/core/field-conditions';
import { footcandlesToLux } from '@shared/core/units';
import { isDecodeError } from '@shared/core/errors';
import { conflict, notFound, unprocessable } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { decodeBudget, encodeBudget } from '../readings/stored-budget';
import { listPlans } from '../plans/plans-service';
import { listProbes } from '../probes/probes-service';
import { loadDecodingCalibration } from '../probes/probe-calibration';
import { createCoefficientSelector, isCalibrationLapsed } from '@shared/core/coefficient-sets';
import { apiFiles } from '@shared/paths';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type FieldRecordRow = typeof fieldRecords.$inferSelect;
type SessionRow = typeof fieldSessions.$inferSelect;
type ProbeRow = typeof probes.$inferSelect;

const iso = (ms: number) => new Date(ms).toISOString();

/**
 * Why a survey takes no field record now, or null. Records are added while it is a draft or
 * returned; once submitted or signed off the phone is told why, and keeps its records.
 */
export function fieldRefusal(survey: Pick<SurveyRow, 'status' | 'name' | 'signedOffAt'>): string | null {
  if (WORKED_ON_STATUSES.includes(survey.status)) return null;
  if (survey.status === 'signed_off') {
    return `Survey "${survey.name}" was signed off${survey.signedOffAt ? ` on ${iso(survey.signedOffAt).slice(0, 16).replace('T', ' ')} UTC` : ''}; it is read-only and takes no more field records`;
  }
  return `Survey "${survey.name}" is submitted for review; it takes field records again only if the reviewer returns it`;
}

function assertAccepts(survey: Pick<SurveyRow, 'status' | 'name' | 'signedOffAt'>) {
  const why = fieldRefusal(survey);
  if (why) throw conflict(why, { reason: survey.status === 'signed_off' ? 'signed_off' : 'submitted' });
}

/** A plan of the survey's site (404 for an unknown or another organisation's plan; 422 for another site's). */
function assertPlanOfSite(db: Db | Tx, organizationId: number, siteId: number, planId: number) {
  const p = db.select({ id: plans.id, siteId: plans.siteId }).from(plans).where(eq(plans.id, planId)).get();
  if (!p) throw notFound(`Plan ${planId}`);
  if (p.siteId !== siteId) {
    throw unprocessable(`Plan ${planId} belongs to another site than this survey`, [{ path: 'planId', message: 'not a plan of this survey\'s site' }]);
  }
  void organizationId;
}

function orgProbe(db: Db | Tx, organizationId: number, probeId: number): ProbeRow {
  const p = db.select().from(probes).where(and(eq(probes.id, probeId), eq(probes.organizationId, organizationId))).get();
  if (!p) throw notFound(`Probe ${probeId}`);
  if (p.status === 'retired') throw unprocessable(`Probe ${p.serial} is retired`, [{ path: 'probeId', message: 'retired' }]);
  return p;
}

/** The approved coefficient set in force at t, chosen by the core's selector as for logged readings. */
function setInForce(db: Db | Tx, organizationId: number, probeId: number, t: number) {
  const cal = loadDecodingCalibration(db as Db, organizationId, { probeId });
  return createCoefficientSelector([...cal.values()][0]?.sets ?? []).select(t);
}

/** The hand-held meter as the core needs it; 422 when its accuracy is unknown at that time. */
function manualMeter(db: Db | Tx, probe: ProbeRow, t: number): { meter: ManualMeter; setId: number | null; lapsed: boolean } {
  if (probe.kind !== 'manual') {
    throw unprocessable(`Probe ${probe.serial} logs its own readings: record "measured here now" marks for it and upload its log, or choose a hand-held meter`, [{ path: 'probeId', message: 'not a hand-held meter' }]);
  }
  const set = setInForce(db, probe.organizationId, probe.id, t);
  const range = { rangeLowLux: probe.rangeLowLux, rangeHighLux: probe.rangeHighLux };
  const lapsed = set !== null && isCalibrationLapsed(set, t);
  const setId = set === null ? null : Number(set.id);
  if (probe.meterClass) return { meter: { accuracy: { kind: 'class', meterClass: probe.meterClass }, ...range }, setId, lapsed };
  if (!set) {
    throw unprocessable(`Meter ${probe.serial} has no approved coefficient set in force at ${iso(t)}, so its certificate's uncertainty is unknown: approve a set or give the meter a class`, [{ path: 'probeId', message: 'no approved set' }]);
  }
  return { meter: { accuracy: { kind: 'certificate', uRel: set.gains[0]?.uRel ?? 0 }, ...range }, setId, lapsed };
}

/** The decode field readings go under: the active one, or a new one for a survey with no log yet. */
function activeDecodeFor(tx: Tx, survey: SurveyRow, actorId: number, now: number): number {
  const current = tx.select({ id: surveys.activeDecodeId }).from(surveys).where(eq(surveys.id, survey.id)).get()!.id;
  if (current !== null) return current;
  const d = tx.insert(decodes).values({ surveyId: survey.id, reason: 'field', createdBy: actorId, createdAt: now }).returning().get();
  tx.update(surveys).set({ activeDecodeId: d.id }).where(eq(surveys.id, survey.id)).run();
  return d.id;
}

/**
 * Carries the field readings of one decode into a new one (re-decoding rebuilds only what came
 * from logs; typed readings have no samples to decode again).
 */
export function carryFieldReadings(tx: Tx, surveyId: number, fromDecodeId: number | null, toDecodeId: number): number {
  if (fromDecodeId === null) return 0;
  const rows = tx.select().from(readings).where(and(eq(readings.surveyId, surveyId), eq(readings.decodeId, fromDecodeId), isNotNull(readings.fieldRecordId))).all();
  for (const { id: _id, ...r } of rows) tx.insert(readings).values({ ...r, decodeId: toDecodeId }).run();
  return rows.length;
}

function sessionConditions(s: SessionRow | null): SessionConditions | null {
  return s ? { lightsOnAt: s.lightsOnAt, sky: s.sky, lampBurnInHours: s.lampBurnInHours } : null;
}

/** The session a record belongs to: its own, else the latest started before it. */
function sessionOf(r: Pick<FieldRecordRow, 'sessionId' | 'timeMs'>, sessions: SessionRow[]): SessionRow | null {
  if (r.sessionId !== null) return sessions.find((s) => s.id === r.sessionId) ?? null;
  let best: SessionRow | null = null;
  for (const s of sessions) if (s.startedAt <= r.timeMs && (!best || s.startedAt > best.startedAt)) best = s;
  return best;
}

function presentSession(s: SessionRow): FieldSession {
  return {
    id: s.id, idempotencyKey: s.idempotencyKey, measuredBy: s.measuredBy, startedAt: iso(s.startedAt), lightsOnAt: s.lightsOnAt === null ? null : iso(s.lightsOnAt),
    supplyVoltageV: s.supplyVoltageV, ambientTempC: s.ambientTempC, sky: s.sky, blinds: s.blinds, lampBurnInHours: s.lampBurnInHours, daylightExcluded: s.daylightExcluded, note: s.note,
  };
}

function presentRecords(db: Db | Tx, survey: SurveyRow, rows: FieldRecordRow[]): FieldRecord[] {
  if (rows.length === 0) return [];
  const sessions = db.select().from(fieldSessions).where(eq(fieldSessions.surveyId, survey.id)).all();
  const readingRows = db.select().from(readings)
    .where(and(eq(readings.surveyId, survey.id), eq(readings.decodeId, survey.activeDecodeId ?? -1), inArray(readings.fieldRecordId, rows.map((r) => r.id)))).all();
  const readingOf = new Map(readingRows.map((r) => [r.fieldRecordId!, r]));
  const probeIds = [...new Set(rows.map((r) => r.probeId).filter((x): x is number => x !== null))];
  const serials = new Map(probeIds.length ? db.select({ id: probes.id, serial: probes.serial }).from(probes).where(inArray(probes.id, probeIds)).all().map((p) => [p.id, p.serial]) : []);
  const daylightExcluded = survey.conditions?.daylightExcluded ?? false;
  return rows.map((r) => {
    const rd = readingOf.get(r.id);
    const paired = rd?.note?.startsWith('paired:') ?? false;
    return {
      id: r.id, idempotencyKey: r.idempotencyKey, kind: r.kind, sessionId: r.sessionId, point: r.point, zoneId: r.zoneId, plannedPointId: r.plannedPointId, planId: r.planId, xM: r.xM, yM: r.yM,
      probeId: r.probeId, probeSerial: r.probeId === null ? null : serials.get(r.probeId) ?? null, values: r.values, unit: r.unit, lights: r.lights, reason: r.reason, note: r.note,
      recordedAt: iso(r.timeMs),
      reading: rd && rd.lux !== null ? { id: rd.id, lux: rd.lux, uLux: rd.uLux ?? 0, n: rd.sampleCount, paired } : null,
      warnings: r.kind === 'skip' || r.kind === 'zone_note' ? [] : conditionWarnings(r.timeMs, sessionConditions(sessionOf(r, sessions)), { daylightExcluded }, { paired: paired || r.lights === 'off' }),
    };
  });
}

export function recordFieldSession(deps: Deps, user: SessionUser, surveyId: number, input: FieldSessionBody): { session: FieldSession; alreadyStored: boolean } {
  const body = fieldSessionBodySchema.parse(input);
  const survey = getSurveyRow(deps.db, user, surveyId);
  const earlier = deps.db.select().from(fieldSessions).where(and(eq(fieldSessions.surveyId, survey.id), eq(fieldSessions.idempotencyKey, body.idempotencyKey))).get();
  if (earlier) return { session: presentSession(earlier), alreadyStored: true };
  assertAccepts(survey);
  const now = deps.clock.now();
  const row = deps.db.transaction((tx) => {
    const created = tx.insert(fieldSessions).values({
      organizationId: user.organizationId, surveyId: survey.id, idempotencyKey: body.idempotencyKey, measuredBy: body.measuredBy, startedAt: Date.parse(body.startedAt),
      lightsOnAt: body.lightsOnAt ? Date.parse(body.lightsOnAt) : null, supplyVoltageV: body.supplyVoltageV ?? null, ambientTempC: body.ambientTempC ?? null, sky: body.sky ?? null,
      blinds: body.blinds ?? null, lampBurnInHours: body.lampBurnInHours ?? null, daylightExcluded: body.daylightExcluded, note: body.note ?? null, createdBy: user.id, createdAt: now,
    }).returning().get();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'field_session', entityId: created.id, surveyId: survey.id, action: 'recorded', after: body, at: now });
    return created;
  });
  return { session: presentSession(row), alreadyStored: false };
}

/**
 * Stores one record from the field view in one transaction, once per idempotency key: a key seen
 * before answers the stored record (alreadyStored), even after sign-off. Typed values become a
 * reading (mean, meter and spread in the budget); a lights-off half pairs with the latest
 * lights-on record at the point, and when the survey asks for it the point is judged on E_on - E_off.
 */
export function recordFieldRecord(deps: Deps, user: SessionUser, surveyId: number, input: FieldRecordBody): { record: FieldRecord; alreadyStored: boolean } {
  const body = fieldRecordBodySchema.parse(input);
  const survey = getSurveyRow(deps.db, user, surveyId);
  const earlier = deps.db.select().from(fieldRecords).where(and(eq(fieldRecords.surveyId, survey.id), eq(fieldRecords.idempotencyKey, body.idempotencyKey))).get();
  if (earlier) return { record: presentRecords(deps.db, getSurveyRow(deps.db, user, surveyId), [earlier])[0], alreadyStored: true };
  assertAccepts(survey);
  const timeMs = Date.parse(body.recordedAt);
  const now = deps.clock.now();

  const row = deps.db.transaction((tx) => {
    let sessionId: number | null = null;
    if (body.sessionKey) {
      const s = tx.select({ id: fieldSessions.id }).from(fieldSessions).where(and(eq(fieldSessions.surveyId, survey.id), eq(fieldSessions.idempotencyKey, body.sessionKey))).get();
      if (!s) throw unprocessable(`Session ${body.sessionKey} is not recorded on this survey: sync the session's conditions first`, [{ path: 'sessionKey', message: 'unknown session' }]);
      sessionId = s.id;
    }
    if (body.kind === 'zone_note') {
      const zone = zoneOfSurveySite(tx, survey, body.zoneId);
      const created = tx.insert(fieldRecords).values({
        organizationId: user.organizationId, surveyId: survey.id, idempotencyKey: body.idempotencyKey, kind: 'zone_note', sessionId, point: zone.name, zoneId: zone.id,
        planId: zone.planId, note: body.note, timeMs, createdBy: user.id, createdAt: now,
      }).returning().get();
      recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'field_record', entityId: created.id, surveyId: survey.id, action: 'recorded', after: body, at: now });
      return created;
    }
    const place = resolvePlace(tx, user, survey, body);
    let probe: ProbeRow | null = null;
    if (body.kind !== 'skip' && body.probeId != null) probe = orgProbe(tx, user.organizationId, body.probeId);
    if (body.kind === 'mark' && probe?.kind === 'manual') {
      throw unprocessable(`Meter ${probe.serial} does not log: type its values instead of marking the point`, [{ path: 'probeId', message: 'a hand-held meter has no log to match' }]);
    }

    const created = tx.insert(fieldRecords).values({
      organizationId: user.organizationId, surveyId: survey.id, idempotencyKey: body.idempotencyKey, kind: body.kind, sessionId, point: place.point,
      plannedPointId: place.plannedPointId, planId: place.planId, xM: place.xM, yM: place.yM, probeId: probe?.id ?? null,
      values: body.kind === 'typed' ? body.values : null, unit: body.kind === 'typed' ? body.unit : null, lights: body.kind === 'typed' ? body.lights ?? null : null,
      reason: body.kind === 'skip' ? body.reason : null, note: body.note ?? null, timeMs, createdBy: user.id, createdAt: now,
    }).returning().get();

    if (body.kind === 'typed') {
      const { meter, setId, lapsed } = manualMeter(tx, probe!, timeMs);
      const lux = body.unit === 'fc' ? body.values.map(footcandlesToLux) : body.values;
      let r;
      try {
        r = typedReading(lux, meter);
      } catch (e) {
        if (isDecodeError(e)) throw unprocessable(`values: ${e.message}`, [{ path: `values.${(e.detail.index as number | undefined) ?? 0}`, message: e.message }]);
        throw e;
      }
      const decodeId = activeDecodeFor(tx, survey, user.id, now);
      const reading = {
        surveyId: survey.id, decodeId, importId: null, fieldRecordId: created.id, point: place.point, xM: place.xM, yM: place.yM, planId: place.planId, role: 'task' as const,
        timeMs, probeId: probe!.id, lux: r.lux, uLux: r.uLux, luxBound: 'exact' as const, flag: lapsed ? 'calibration_lapsed' as const : 'ok' as const, gainCode: null,
        sampleCount: r.n, chosenSample: null, coefficientSetId: setId, budget: JSON.parse(encodeBudget(r.budget)) as unknown, note: body.note ?? null,
      };
      if (body.lights === 'off') {
        pairWithLightsOn(tx, survey, decodeId, place.point, place.plannedPointId, { lux: r.lux, uLux: r.uLux, timeMs, budget: r.budget });
      } else {
        tx.insert(readings).values(reading).run();
      }
    }
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'field_record', entityId: created.id, surveyId: survey.id, action: 'recorded', after: body, at: now });
    return created;
  });
  return { record: presentRecords(deps.db, getSurveyRow(deps.db, user, surveyId), [row])[0], alreadyStored: false };
}

/**
 * The lights-off half of a pair: the latest lights-on record at the same point. Refused (422) when
 * there is none, when they are further apart than MAX_PAIR_GAP_MS, or when off reads higher. With
 * the survey's pairedDaylight, the lights-on reading becomes E_on - E_off with both budgets combined.
 */
function pairWithLightsOn(tx: Tx, survey: SurveyRow, decodeId: number, point: string, plannedPointId: number | null,
  off: { lux: number; uLux: number; timeMs: number; budget: { name: string; uRel: number }[] }) {
  const ons = tx.select().from(fieldRecords).where(and(eq(fieldRecords.surveyId, survey.id), eq(fieldRecords.kind, 'typed'), eq(fieldRecords.lights, 'on'), lte(fieldRecords.timeMs, off.timeMs)))
    .orderBy(desc(fieldRecords.timeMs)).all().filter((r) => (plannedPointId !== null ? r.plannedPointId === plannedPointId : r.point === point));
  const on = ons[0];
  const onReading = on ? tx.select().from(readings).where(and(eq(readings.fieldRecordId, on.id), eq(readings.decodeId, decodeId))).get() : undefined;
  if (!on || !onReading || onReading.lux === null) {
    throw unprocessable(`No lights-on reading at point ${point} to pair with: record the reading with the lights on first`, [{ path: 'lights', message: 'no lights-on half' }]);
  }
  const p = pairedSubtraction({ lux: onReading.lux, uLux: onReading.uLux ?? 0, timeMs: onReading.timeMs }, { lux: off.lux, uLux: off.uLux, timeMs: off.timeMs });
  if (!p.ok) throw unprocessable(p.reason, [{ path: 'recordedAt', message: p.reason }]);
  if (!survey.conditions?.pairedDaylight) return;
  // Per part, the two absolute contributions in quadrature over the difference: the parts still add up to p.uLux.
  const onParts = decodeBudget(onReading.budget);
  const names = [...new Set([...onParts.map((x) => x.name), ...off.budget.map((x) => x.name)])];
  const diff = p.lux;
  const budget = names.map((name) => {
    const a = (onParts.find((x) => x.name === name)?.uRel ?? 0) * onReading.lux!;
    const b = (off.budget.find((x) => x.name === name)?.uRel ?? 0) * off.lux;
    return { name, uRel: diff > 0 ? Math.hypot(a, b) / diff : 0 };
  });
  tx.update(readings).set({
    lux: diff, uLux: p.uLux, budget: JSON.parse(encodeBudget(budget as never)) as unknown,
    note: `paired: ${onReading.lux} lx lights on − ${off.lux} lx lights off (${Math.round(p.gapMs / 1000)} s apart)`,
  }).where(eq(readings.id, onReading.id)).run();
}

/**
 * Where a record was taken: a planned point of this survey (its label, plan and position win over
 * what the phone sent), or the given plan position (checked). A planned point of another survey
 * is refused (422); one of another organisation is not found (404).
 */
function resolvePlace(tx: Tx, user: SessionUser, survey: SurveyRow & { site: { id: number } }, body: { plannedPointId?: number | null; planId?: number | null; xM?: number | null; yM?: number | null; point: string }) {
  if (body.plannedPointId != null) {
    const p = plannedPointOfSurvey(tx, user, survey, body.plannedPointId);
    return { plannedPointId: p.id, planId: p.planId, xM: p.xM, yM: p.yM, point: p.label };
  }
  if (body.planId != null) assertPlanOfSite(tx, user.organizationId, survey.siteId, body.planId);
  return { plannedPointId: null as number | null, planId: body.planId ?? null, xM: body.xM ?? null, yM: body.yM ?? null, point: body.point };
}

/** A zone on a plan of the survey's site (422 otherwise, naming zoneId). */
export function zoneOfSurveySite(db: Db | Tx, survey: Pick<SurveyRow, 'siteId'>, zoneId: number) {
  const z = db.select({ id: zones.id, name: zones.name, planId: zones.planId, siteId: plans.siteId }).from(zones).innerJoin(plans, eq(plans.id, zones.planId)).where(eq(zones.id, zoneId)).get();
  if (!z || z.siteId !== survey.siteId) throw unprocessable(`Zone ${zoneId} is not a zone of this survey's site`, [{ path: 'zoneId', message: 'not on this site' }]);
  return z;
}

/** A planned point of this survey: 404 unless it belongs to the user's organisation, 422 when it is another survey's. */
export function plannedPointOfSurvey(db: Db | Tx, user: SessionUser, survey: Pick<SurveyRow, 'id' | 'name'>, plannedPointId: number) {
  const row = db.select({ p: plannedPoints, organizationId: sites.organizationId }).from(plannedPoints)
    .innerJoin(surveys, eq(surveys.id, plannedPoints.surveyId)).innerJoin(sites, eq(sites.id, surveys.siteId))
    .where(eq(plannedPoints.id, plannedPointId)).get();
  if (!row || row.organizationId !== user.organizationId) throw notFound(`Planned point ${plannedPointId}`);
  if (row.p.surveyId !== survey.id) {
    throw unprocessable(`Planned point ${row.p.label} belongs to another survey than "${survey.name}"`, [{ path: 'plannedPointId', message: 'a point of another survey' }]);
  }
  return row.p;
}

export function fieldState(deps: Deps, user: SessionUser, surveyId: number): FieldState {
  const survey = getSurveyRow(deps.db, user, surveyId);
  const planRows = listPlans(deps.db, user, survey.siteId);
  const zoneRows = planRows.length ? deps.db.select().from(zones).where(inArray(zones.planId, planRows.map((p) => p.id))).orderBy(asc(zones.id)).all() : [];
  const probeRows = listProbes(deps, user, { status: 'in_service' });
  const now = deps.clock.now();
  const recordRows = deps.db.select().from(fieldRecords).where(eq(fieldRecords.surveyId, survey.id)).orderBy(asc(fieldRecords.timeMs), asc(fieldRecords.id)).all();
  const photoRows = deps.db.select().from(fieldPhotos).where(eq(fieldPhotos.surveyId, survey.id)).orderBy(asc(fieldPhotos.id)).all();
  const sessionRows = deps.db.select().from(fieldSessions).where(eq(fieldSessions.surveyId, survey.id)).orderBy(asc(fieldSessions.startedAt)).all();
  const refusal = fieldRefusal(survey);
  return {
    survey: {
      id: survey.id, name: survey.name, siteName: survey.site.name, siteTimeZone: survey.site.timeZone, status: survey.status,
      daylightExcluded: survey.conditions?.daylightExcluded ?? false, pairedDaylight: survey.conditions?.pairedDaylight ?? false, acceptsRecords: refusal === null, refusal,
    },
    plans: planRows,
    zones: zoneRows.map((z) => ({ id: z.id, planId: z.planId, name: z.name, kind: z.kind, polygon: z.polygon as [number, number][] })),
    plannedPoints: deps.db.select().from(plannedPoints).where(eq(plannedPoints.surveyId, survey.id)).orderBy(asc(plannedPoints.id)).all()
      .map((p) => ({ id: p.id, planId: p.planId, zoneId: p.zoneId, label: p.label, xM: p.xM, yM: p.yM })),
    probes: probeRows.map((p) => ({
      id: p.id, serial: p.serial, kind: p.kind, description: p.description, meterClass: p.meterClass, rangeLowLux: p.rangeLowLux, rangeHighLux: p.rangeHighLux,
      certificateURel: p.kind === 'manual' ? setInForce(deps.db, user.organizationId, p.id, now)?.gains[0]?.uRel ?? null : null, calibrationState: p.calibrationState,
    })),
    sessions: sessionRows.map(presentSession),
    records: presentRecords(deps.db, survey, recordRows),
    photos: photoRows.map(presentPhoto),
    warmUpMinutes: WARM_UP_MS / 60_000,
    maxPairGapS: MAX_PAIR_GAP_MS / 1000,
  };
}

export function presentPhoto(p: typeof fieldPhotos.$inferSelect): FieldPhoto {
  return {
    id: p.id, idempotencyKey: p.idempotencyKey, point: p.point, plannedPointId: p.plannedPointId, zoneId: p.zoneId, note: p.note, widthPx: p.widthPx, heightPx: p.heightPx,
    locationKept: p.locationKept, takenAt: iso(p.takenAt), url: apiFiles.fieldPhoto(p.id),
  };
}

/** The survey's photos of a zone: those taken in it, and those of a point whose label one of its readings carries. */
export function photosOfZone(db: Db, surveyId: number, zoneId: number, isZonePoint: (label: string) => boolean): FieldPhoto[] {
  return db.select().from(fieldPhotos).where(eq(fieldPhotos.surveyId, surveyId)).orderBy(asc(fieldPhotos.takenAt), asc(fieldPhotos.id)).all()
    .filter((p) => p.zoneId === zoneId || (p.zoneId === null && p.point !== null && isZonePoint(p.point)))
    .map(presentPhoto);
}

/** How a photo's point label is compared with readings' labels (spaces around and case ignored). */
export const photoPointKey = (label: string) => label.trim().toLowerCase();

/** The survey's notes written on a zone in the field view, oldest first. */
export function notesOfZone(db: Db, surveyId: number, zoneId: number): ZoneNote[] {
  return db.select().from(fieldRecords).where(and(eq(fieldRecords.surveyId, surveyId), eq(fieldRecords.kind, 'zone_note'), eq(fieldRecords.zoneId, zoneId)))
    .orderBy(asc(fieldRecords.timeMs), asc(fieldRecords.id)).all()
    .map((r) => ({ id: r.id, note: r.note ?? '', recordedAt: iso(r.timeMs) }));
}

export { assertAccepts as assertSurveyAcceptsFieldRecords };

/**
 * The verdicts' notes from the survey's measurement conditions: task readings (typed or logged)
 * taken before the lights were on, before the warm-up time, with lamps not burnt in, or in
 * daylight where the survey says daylight was excluded; one line per kind naming the points.
 */
export function conditionNotes(db: Db, survey: Pick<SurveyRow, 'id' | 'conditions'>, taskReadings: readonly { point: string; timeMs: number; role: string; note?: string | null }[]): string[] {
  const sessions = db.select().from(fieldSessions).where(eq(fieldSessions.surveyId, survey.id)).all();
  if (sessions.length === 0) return [];
  const daylightExcluded = survey.conditions?.daylightExcluded ?? false;
  const byCode = new Map<string, { message: string; points: string[] }>();
  for (const r of taskReadings) {
    if (r.role !== 'task') continue;
    const session = sessionOf({ sessionId: null, timeMs: r.timeMs }, sessions);
    for (const w of conditionWarnings(r.timeMs, sessionConditions(session), { daylightExcluded }, { paired: r.note?.startsWith('paired:') ?? false })) {
      const entry = byCode.get(w.code) ?? { message: w.message, points: [] };
      entry.points.push(r.point || '(no label)');
      byCode.set(w.code, entry);
    }
  }
  const LEAD: Record<string, string> = {
    before_lights_on: 'taken before the lights were switched on',
    before_warm_up: `taken less than ${WARM_UP_MS / 60_000} min after the lights went on (warm-up time, common practice)`,
    lamps_not_burnt_in: 'taken with lamps burnt in for less than about 100 h (secondary source)',
    daylight_not_excluded: 'taken in daylight although the survey says daylight was excluded',
  };
  return [...byCode.entries()].map(([code, e]) => {
    const shown = [...new Set(e.points)];
    return `${e.points.length} reading(s) ${LEAD[code] ?? e.message}: ${shown.slice(0, 8).join(', ')}${shown.length > 8 ? ` and ${shown.length - 8} more` : ''}.`;
  });
}

/** The sessions' conditions as the report prints them, in time order. */
export function sessionsForReport(db: Db, surveyId: number): FieldSession[] {
  return db.select().from(fieldSessions).where(eq(fieldSessions.surveyId, surveyId)).orderBy(asc(fieldSessions.startedAt)).all().map(presentSession);
}
