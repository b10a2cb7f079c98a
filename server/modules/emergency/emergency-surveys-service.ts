import { max, min } from 'simple-statistics';
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { plans } from '../../db/schema/plans';
import { surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { emergencyLogPasses, emergencyResponses, emergencySurveys } from '../../db/schema/emergency';
import { logImports, readings as readingsTable } from '../../db/schema/surveys';
import { storedFiles, users } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import { RULE_TEXT } from '@shared/core/decision';
import { combineElementVerdicts, EMERGENCY_PASSES, judgeEmergencyElement, type EmergencyPass, type EmergencyPoint, type EmergencyPointRole } from '@shared/core/emergency';
import { passOfLoggedReading, passTimingWarnings } from '@shared/core/emergency-schedule';
import { areaRoleAt, routeStripRoleAt } from '@shared/spatial/emergency-points';
import {
  createEmergencySurveyBodySchema, EMERGENCY_CAUTIONS, updateEmergencySurveyBodySchema,
  type CreateEmergencySurveyBody, type ElementVerdict, type EmergencyConditions, type EmergencySurvey, type ResponseTimesBody, type SiteLogbook,
} from '@shared/schemas/emergency';
import { notFound } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { getSiteRow, siteConditions } from '../sites/sites-service';
import { assertSurveyAbility, currentReadingConditions, getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { surveyAbilities } from '@shared/survey-abilities';
import { decisionRuleOf } from '../organization/organization-service';
import { loadCurrentReadings } from '../compliance/compliance-repository';
import { frozenOf, type FrozenCompliance } from '../compliance/compliance-service';
import { toCoreReading, type JudgeReading } from '../compliance/judge-zones';
import { elementsOfPlans, presentElement, plannedPointsOf, type ElementRow } from './elements-service';
import { presentCriteriaSet, requireCriteriaSet } from './criteria-service';

type EmergencyRow = typeof emergencySurveys.$inferSelect;

/** A positioned reading this close to a safety-equipment point is taken at it (project's choice). */
export const EQUIPMENT_RADIUS_M = 1;

function conditionsOf(r: EmergencyRow): EmergencyConditions {
  return {
    systemType: r.systemType, ratedDurationMin: r.ratedDurationMin, mainsOffAt: new Date(r.mainsOffAt).toISOString(),
    normalLightingOff: r.normalLightingOff, daylightExcluded: r.daylightExcluded, ...(r.notes ? { notes: r.notes } : {}),
  };
}

/** The survey and its emergency settings, if the caller may see it; a plain survey answers 404 here. */
export function getEmergencySurveyRow(db: Db, user: SessionUser, surveyId: number) {
  const survey = getSurveyRow(db, user, surveyId);
  const em = db.select().from(emergencySurveys).where(eq(emergencySurveys.surveyId, survey.id)).get();
  if (!em) throw notFound('Emergency survey');
  return { survey, em };
}

type Matched = { element: ElementRow; role: EmergencyPointRole; label: string; strip: number | null; reading: JudgeReading; pass: EmergencyPass };
type Match = Omit<Matched, 'reading' | 'pass'>;

/** Which element and role a reading belongs to: its label names a planned point, else its position lies on an element of its plan. */
function matcher(elements: ElementRow[]) {
  const byLabel = new Map<string, Match>();
  for (const e of elements) for (const p of plannedPointsOf(e)) byLabel.set(p.label.toLowerCase(), { element: e, role: p.role, label: p.label, strip: p.strip ?? null });
  return (r: JudgeReading): Match | null => {
    const hit = byLabel.get(r.point.trim().toLowerCase());
    if (hit) return hit;
    if (r.xM === null || r.yM === null || r.planId === null) return null;
    const at: [number, number] = [r.xM, r.yM];
    for (const e of elements) {
      if (e.planId !== r.planId) continue;
      let role: EmergencyPointRole | null = null;
      let strip: number | null = null;
      if (e.kind === 'escape_route') ({ role, strip } = routeStripRoleAt(at, e.geometry, e.widthM ?? 0) ?? { role: null, strip: null });
      else if (e.kind === 'open_area') role = areaRoleAt(at, e.geometry, e.borderM ?? 0.5);
      else if (e.kind === 'high_risk_area') role = areaRoleAt(at, e.geometry, 0);
      else if (Math.hypot(at[0] - e.geometry[0][0], at[1] - e.geometry[0][1]) <= EQUIPMENT_RADIUS_M) role = 'equipment';
      if (role) return { element: e, role, label: r.point, strip };
    }
    return null;
  };
}

/** The judgement without what depends on the moment or the caller (status, abilities, frozen time). */
type JudgedEmergency = Omit<EmergencySurvey, 'status' | 'canEdit' | 'frozenAt' | 'review'>;

/**
 * What a sign-off keeps of an emergency survey, in surveys.frozen beside the zone snapshot the
 * workflow freezes for every survey (compliance-service's FrozenCompliance): the verdicts as
 * judged then, and the logbook as it stood, so later changes to criteria sets, elements,
 * readings, the rule or the logbook never alter a signed-off survey or its report.
 */
export type FrozenEmergency = { version: 1; judged: JudgedEmergency; logbook: SiteLogbook };
type FrozenWithEmergency = FrozenCompliance & { emergency?: FrozenEmergency };

/** The emergency part of a signed-off survey's snapshot, or null (not signed off, or not an emergency survey). */
export function frozenEmergencyOf(survey: SurveyRow): FrozenEmergency | null {
  return (frozenOf(survey) as FrozenWithEmergency | null)?.emergency ?? null;
}

/**
 * The emergency snapshot to add to surveys.frozen at sign-off, or null for a survey that is not
 * an emergency survey. Called by the workflow's sign-off inside its one freezing step.
 */
export function freezeEmergency(db: Db, user: SessionUser, survey: SurveyRow, logbook: (siteId: number) => SiteLogbook): FrozenEmergency | null {
  const em = db.select().from(emergencySurveys).where(eq(emergencySurveys.surveyId, survey.id)).get();
  if (!em) return null;
  const row = getSurveyRow(db, user, survey.id);
  return { version: 1, judged: liveEmergencyJudgement(db, user, row, em), logbook: logbook(survey.siteId) };
}

/** An emergency survey's answer: the frozen judgement once signed off, else judged now. */
export function judgeEmergencySurvey(db: Db, user: SessionUser, surveyId: number): EmergencySurvey {
  const { survey, em } = getEmergencySurveyRow(db, user, surveyId);
  return presentJudged(db, survey, frozenEmergencyOf(survey)?.judged ?? liveEmergencyJudgement(db, user, survey, em), surveyAbilities(user, survey).edit);
}

/** The answer for a survey row and its judgement (live, or frozen at sign-off), with who submitted and signed it off. */
export function presentJudged(db: Db, survey: SurveyRow, judged: JudgedEmergency, canEdit: boolean): EmergencySurvey {
  const frozen = survey.status === 'signed_off' ? (survey.frozen as FrozenWithEmergency | null) : null;
  const nameOf = (id: number | null) => (id === null ? null : db.select({ name: users.name }).from(users).where(eq(users.id, id)).get()?.name ?? null);
  const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
  return {
    ...judged, status: survey.status, canEdit, frozenAt: frozen?.emergency ? new Date(frozen.frozenAt).toISOString() : null,
    review: { submittedByName: nameOf(survey.submittedBy), submittedAt: iso(survey.submittedAt), signedOffByName: nameOf(survey.signedOffBy), signedOffAt: iso(survey.signedOffAt), reviewComment: survey.reviewComment },
  };
}

/**
 * Judges every element of the survey's site in each pass (shared/core/emergency) under the
 * organisation's decision rule. A reading's pass is its log's, where the surveyor said which
 * pass the log holds, else by time from the mains failing (passOfLoggedReading); readings before
 * the mains failed belong to no pass and are counted.
 */
function liveEmergencyJudgement(db: Db, user: SessionUser, survey: SurveyRow & { site: { name: string; timeZone: string } }, em: EmergencyRow): JudgedEmergency {
  const set = requireCriteriaSet(db, user.organizationId, em.criteriaSetKey);
  const rule = decisionRuleOf(db, user.organizationId);
  const sitePlans = db.select().from(plans).where(eq(plans.siteId, survey.siteId)).orderBy(asc(plans.id)).all();
  const elements = elementsOfPlans(db, sitePlans.map((p) => p.id));
  const responses = db.select().from(emergencyResponses).where(eq(emergencyResponses.surveyId, survey.id)).all();
  const readings = loadCurrentReadings(db, survey).filter((r) => r.role === 'task');
  const match = matcher(elements);
  const logs = surveyLogs(db, survey);
  const logPass = new Map(logs.filter((l) => l.pass !== null).map((l) => [l.importId, l.pass as EmergencyPass]));
  const importOf = new Map(db.select({ id: readingsTable.id, importId: readingsTable.importId }).from(readingsTable).where(and(...currentReadingConditions(survey))).all().map((r) => [r.id, r.importId]));

  const readingsPerLog = new Map<number, number>();
  // Readings typed in the field view have no import.
  for (const id of importOf.values()) if (id !== null) readingsPerLog.set(id, (readingsPerLog.get(id) ?? 0) + 1);

  let before = 0;
  let unmatched = 0;
  const matched: Matched[] = [];
  const passTimes: { pass: EmergencyPass; timeMs: number }[] = [];
  for (const r of readings) {
    const pass = passOfLoggedReading(r.timeMs, em.mainsOffAt, em.ratedDurationMin, logPass.get(importOf.get(r.id) ?? -1) ?? null);
    if (pass === null) { before++; continue; }
    passTimes.push({ pass, timeMs: r.timeMs });
    const m = match(r);
    if (!m) { unmatched++; continue; }
    matched.push({ ...m, reading: r, pass });
  }

  const warnings = passTimingWarnings(passTimes, em.mainsOffAt, em.ratedDurationMin);
  const conditionProblems: string[] = [];
  if (!em.normalLightingOff) conditionProblems.push('The normal lighting was not off: readings include it, so compliance is not shown.');
  if (!em.daylightExcluded) conditionProblems.push('Daylight was not excluded: readings include it, so compliance is not shown.');
  warnings.push(...conditionProblems);
  if (before > 0) warnings.push(`${before} reading(s) were taken before the mains failed and belong to no pass.`);
  if (unmatched > 0) warnings.push(`${unmatched} reading(s) match no planned point label and lie on no route, area or equipment point.`);

  const measuredPasses = EMERGENCY_PASSES.filter((p) => passTimes.some((t) => t.pass === p));
  const planName = new Map(sitePlans.map((p) => [p.id, p.name]));
  const elementVerdicts: ElementVerdict[] = elements.map((e) => {
    const mine = matched.filter((m) => m.element.id === e.id);
    const points: EmergencyPoint[] = mine.map((m) => ({ label: m.label, role: m.role, pass: m.pass, strip: m.strip, reading: toCoreReading(m.reading) }));
    const resp = responses.find((r) => r.elementId === e.id) ?? null;
    const presented = presentElement(db, user.organizationId, e);
    const result = judgeEmergencyElement({ kind: e.kind, widthM: e.widthM, normalEmLux: presented.effectiveNormalEmLux, response: resp, points }, set, rule);
    let verdict = result.verdict;
    const reasons = [...result.reasons];
    if (verdict === 'meets' && conditionProblems.length) { verdict = 'inconclusive'; reasons.push(...conditionProblems); }
    if (e.stair) reasons.push('A stair: each tread needs light; a competent person checks the stair on site.');
    const measuredLabels = (pass: EmergencyPass) => new Set(mine.filter((m) => m.pass === pass).map((m) => m.label.toLowerCase()));
    return {
      element: presented, planName: planName.get(e.planId) ?? '', verdict, checks: result.checks, reasons, worstPoint: result.worstPoint,
      points: result.points.map((p, i) => ({ ...p, xM: mine[i].reading.xM, yM: mine[i].reading.yM, readingId: mine[i].reading.id })),
      response: resp ? { toHalfS: resp.toHalfS, toFullS: resp.toFullS } : null,
      unmeasured: measuredPasses.map((pass) => ({ pass, labels: presented.plannedPoints.map((p) => p.label).filter((l) => !measuredLabels(pass).has(l.toLowerCase())) })).filter((u) => u.labels.length > 0),
    };
  });

  const passes = EMERGENCY_PASSES.map((pass) => {
    const ts = passTimes.filter((t) => t.pass === pass).map((t) => t.timeMs);
    const first = ts.length ? min(ts) : null;
    const last = ts.length ? max(ts) : null;
    return {
      pass, readings: ts.length, firstAt: first === null ? null : new Date(first).toISOString(), lastAt: last === null ? null : new Date(last).toISOString(),
      fromMin: first === null ? null : (first - em.mainsOffAt) / 60_000, toMin: last === null ? null : (last - em.mainsOffAt) / 60_000,
    };
  });

  return {
    surveyId: survey.id, name: survey.name, siteId: survey.siteId, siteName: survey.site.name, siteTimeZone: survey.site.timeZone, startedOn: survey.startedOn,
    criteriaSet: presentCriteriaSet(set), conditions: conditionsOf(em), rule, ruleText: RULE_TEXT[rule],
    verdict: combineElementVerdicts(elementVerdicts.map((v) => v.verdict)),
    passes, logs: logs.map((l) => ({ ...l, readings: readingsPerLog.get(l.importId) ?? 0 })), elements: elementVerdicts, readingsBeforeMainsOff: before, readingsUnmatched: unmatched, warnings,
    cautions: [...EMERGENCY_CAUTIONS, ...set.notes],
  };
}

/** The survey's accepted logs, oldest first, with the pass the surveyor said each holds (null: by time). */
function surveyLogs(db: Db, survey: Pick<SurveyRow, 'id'>) {
  const said = new Map(db.select().from(emergencyLogPasses).where(eq(emergencyLogPasses.surveyId, survey.id)).all().map((r) => [r.importId, r.pass]));
  return db.select({ importId: logImports.id, filename: storedFiles.filename, createdAt: logImports.createdAt }).from(logImports).innerJoin(storedFiles, eq(storedFiles.id, logImports.fileId))
    .where(and(eq(logImports.surveyId, survey.id), eq(logImports.status, 'done'))).orderBy(asc(logImports.createdAt), asc(logImports.id)).all()
    .map((l) => ({ importId: l.importId, filename: l.filename, uploadedAt: new Date(l.createdAt).toISOString(), pass: said.get(l.importId) ?? null }));
}

/**
 * Says which pass one of the survey's logs holds (null: split it by time again). Draft or
 * returned surveys only; a log of another survey answers 404.
 */
export function setLogPass(deps: Deps, user: SessionUser, surveyId: number, importId: number, pass: EmergencyPass | null): EmergencySurvey {
  const { survey } = getEmergencySurveyRow(deps.db, user, surveyId);
  const log = deps.db.select().from(logImports).where(and(eq(logImports.id, importId), eq(logImports.surveyId, survey.id), eq(logImports.status, 'done'))).get();
  if (!log) throw notFound('Log of this survey');
  assertSurveyAbility(user, survey, 'edit');
  deps.db.transaction((tx) => {
    const prev = tx.select().from(emergencyLogPasses).where(and(eq(emergencyLogPasses.surveyId, survey.id), eq(emergencyLogPasses.importId, importId))).get();
    if (prev) tx.delete(emergencyLogPasses).where(eq(emergencyLogPasses.id, prev.id)).run();
    if (pass !== null) tx.insert(emergencyLogPasses).values({ surveyId: survey.id, importId, pass }).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'emergency_log_pass_set', before: { importId, pass: prev?.pass ?? null }, after: { importId, pass }, at: deps.clock.now() });
  });
  return judgeEmergencySurvey(deps.db, user, surveyId);
}

export function listEmergencySurveys(db: Db, user: SessionUser, siteId?: number) {
  const where = siteConditions(db, user);
  if (siteId) where.push(eq(surveys.siteId, siteId));
  return db.select({ survey: surveys, site: sites, em: emergencySurveys }).from(emergencySurveys)
    .innerJoin(surveys, eq(surveys.id, emergencySurveys.surveyId)).innerJoin(sites, eq(sites.id, surveys.siteId))
    .where(and(...where)).orderBy(desc(surveys.createdAt), desc(surveys.id)).all()
    .map(({ survey, site, em }) => ({ surveyId: survey.id, name: survey.name, siteId: site.id, siteName: site.name, status: survey.status, criteriaSetKey: em.criteriaSetKey, startedOn: survey.startedOn, createdAt: new Date(survey.createdAt).toISOString() }));
}

function emergencyValues(c: EmergencyConditions) {
  return { systemType: c.systemType, ratedDurationMin: c.ratedDurationMin, mainsOffAt: Date.parse(c.mainsOffAt), normalLightingOff: c.normalLightingOff, daylightExcluded: c.daylightExcluded, notes: c.notes ?? null };
}

/** Creates the survey and its emergency settings in one transaction. */
export function createEmergencySurvey(deps: Deps, user: SessionUser, input: CreateEmergencySurveyBody): EmergencySurvey {
  const body = createEmergencySurveyBodySchema.parse(input);
  const site = getSiteRow(deps.db, user, body.siteId);
  requireCriteriaSet(deps.db, user.organizationId, body.criteriaSetKey);
  const now = deps.clock.now();
  const id = deps.db.transaction((tx) => {
    const s = tx.insert(surveys).values({
      organizationId: user.organizationId, siteId: site.id, name: body.name, startedOn: body.startedOn ?? null,
      conditions: { daylightExcluded: body.conditions.daylightExcluded, ...(body.conditions.notes ? { notes: body.conditions.notes } : {}) }, status: 'draft', createdBy: user.id, createdAt: now,
    }).returning().get();
    tx.insert(emergencySurveys).values({ surveyId: s.id, criteriaSetKey: body.criteriaSetKey, ...emergencyValues(body.conditions) }).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey', entityId: s.id, surveyId: s.id, action: 'created', after: { ...body, kind: 'emergency' }, at: now });
    return s.id;
  });
  return judgeEmergencySurvey(deps.db, user, id);
}

export function updateEmergencySurvey(deps: Deps, user: SessionUser, surveyId: number, input: unknown): EmergencySurvey {
  const body = updateEmergencySurveyBodySchema.parse(input);
  const { survey, em } = getEmergencySurveyRow(deps.db, user, surveyId);
  assertSurveyAbility(user, survey, 'edit');
  if (body.criteriaSetKey) requireCriteriaSet(deps.db, user.organizationId, body.criteriaSetKey);
  const set = { ...(body.criteriaSetKey ? { criteriaSetKey: body.criteriaSetKey } : {}), ...(body.conditions ? emergencyValues(body.conditions) : {}) };
  deps.db.transaction((tx) => {
    if (Object.keys(set).length) tx.update(emergencySurveys).set(set).where(eq(emergencySurveys.surveyId, survey.id)).run();
    if (body.conditions) tx.update(surveys).set({ conditions: { daylightExcluded: body.conditions.daylightExcluded, ...(body.conditions.notes ? { notes: body.conditions.notes } : {}) } }).where(eq(surveys.id, survey.id)).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'emergency_settings_changed', before: { criteriaSetKey: em.criteriaSetKey, conditions: conditionsOf(em) }, after: body, at: deps.clock.now() });
  });
  return judgeEmergencySurvey(deps.db, user, surveyId);
}

/** Records the response times typed for one element in this survey (the element must be on the survey's site). */
export function setResponseTimes(deps: Deps, user: SessionUser, surveyId: number, elementId: number, body: ResponseTimesBody): EmergencySurvey {
  const { survey } = getEmergencySurveyRow(deps.db, user, surveyId);
  const planIds = deps.db.select({ id: plans.id }).from(plans).where(eq(plans.siteId, survey.siteId)).all().map((p) => p.id);
  const element = elementsOfPlans(deps.db, planIds).find((e) => e.id === elementId);
  if (!element) throw notFound('Emergency element');
  assertSurveyAbility(user, survey, 'edit');
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    const prev = tx.select().from(emergencyResponses).where(and(eq(emergencyResponses.surveyId, survey.id), eq(emergencyResponses.elementId, elementId))).get();
    if (prev) tx.update(emergencyResponses).set(body).where(eq(emergencyResponses.id, prev.id)).run();
    else tx.insert(emergencyResponses).values({ surveyId: survey.id, elementId, ...body }).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'response_times_recorded', before: prev ?? null, after: { elementId, ...body }, at: now });
  });
  return judgeEmergencySurvey(deps.db, user, surveyId);
}

/** Whether a survey is an emergency survey (for other modules' listings). */
export function emergencySurveyIds(db: Db, surveyIds: number[]): Set<number> {
  if (surveyIds.length === 0) return new Set();
  return new Set(db.select({ id: emergencySurveys.surveyId }).from(emergencySurveys).where(inArray(emergencySurveys.surveyId, surveyIds)).all().map((r) => r.id));
}
