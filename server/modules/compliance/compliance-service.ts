import { and, desc, eq, ne, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { emergencySurveys } from '../../db/schema/emergency';
import { users } from '../../db/schema/organizations';
import { RULE_TEXT, type AcceptanceRule } from '@shared/core/decision';
import { gridRuleText } from '@shared/core/zone-stats';
import type { SessionUser } from '@shared/schemas/auth';
import type { ComplianceCounts, ComplianceResponse, MaintenanceResponse, MaintenanceZone, SitesOverviewResponse, ZoneCompliance, ZoneDetailResponse } from '@shared/schemas/compliance';
import type { TargetEntry } from '@shared/schemas/targets';
import { surveyAbilities } from '@shared/survey-abilities';
import { notFound } from '../../http/errors';
import { getSurveyRow, installationOf, type SurveyRow } from '../surveys/surveys-service';
import { installationSummary, maintenanceStatus, type Installation } from '@shared/core/maintained';
import type { InstallationInfo } from '@shared/schemas/surveys';
import { siteConditions } from '../sites/sites-service';
import { decisionRuleOf } from '../organization/organization-service';
import { getVisibleTarget, presentTarget } from '../targets/targets-service';
import { judgeZones, worstFirst, type JudgedZone, type JudgeReading, type JudgeResult } from './judge-zones';
import { conditionNotes, photosOfZone } from '../field/field-service';
import { loadCurrentReadings, loadPlacementsOnPlannedPoints, loadPlannedGrids, loadReadingsById, loadSitePlans, loadUsedCoefficientSets, placementKey, type UsedCoefficientSet } from './compliance-repository';

/** What a sign-off keeps in surveys.frozen: later target, rule or calibration changes never alter it. */
export type FrozenCompliance = {
  version: 1;
  frozenAt: number;
  rule: AcceptanceRule;
  ruleText: string;
  gridRule: string;
  decodeId: number | null;
  hasDaylightReference: boolean;
  unassignedPoints: number;
  warnings: string[];
  zones: JudgedZone[];
  targets: TargetEntry[];
  coefficientSets: UsedCoefficientSet[];
  /** New or in service (absent in sign-offs frozen before it was kept: in service). */
  installation?: InstallationInfo;
};

const IN_SERVICE: InstallationInfo = { state: 'in_service', maintenanceFactor: null, parts: null };

/** The core's Installation from the stored or frozen one. */
export function coreInstallation(info: InstallationInfo): Installation {
  return info.state === 'new' && info.maintenanceFactor !== null ? { state: 'new', maintenanceFactor: info.maintenanceFactor, parts: info.parts } : { state: 'in_service' };
}

/** The verdicts as they stand now, from the current readings, zones, targets and the organisation's rule. */
export function liveCompliance(db: Db, organizationId: number, survey: SurveyRow, rule: AcceptanceRule = decisionRuleOf(db, organizationId)) {
  const plans = loadSitePlans(db, organizationId, survey.siteId);
  const allReadings = loadCurrentReadings(db, survey);
  // Each task reading is judged on the plan its log named (readings.planId); reference readings pair with every plan.
  const byPlan = new Map<number, JudgeReading[]>(plans.map((p) => [p.planId, []]));
  let withoutPlan = 0;
  for (const r of allReadings) {
    if (r.role !== 'task') continue;
    const list = r.planId === null ? undefined : byPlan.get(r.planId);
    if (list) list.push(r);
    else if (r.xM !== null && plans.length > 0) withoutPlan++;
  }
  const reference = allReadings.filter((r) => r.role === 'reference');
  const daylightExcluded = survey.conditions?.daylightExcluded ?? false;
  const installation = coreInstallation(installationOf(survey));
  const plannedGrids = loadPlannedGrids(db, survey.id);
  const onPlanned = loadPlacementsOnPlannedPoints(db, survey.id);
  if (onPlanned.size > 0) for (const r of allReadings) r.plannedPointId = onPlanned.get(placementKey(r.point, r.probeId, r.timeMs)) ?? null;
  const perPlan = plans.map((p) => judgeZones({ zones: p.zones, readings: [...byPlan.get(p.planId)!, ...reference], rule, daylightExcluded, installation, gridRounding: survey.gridRounding, plannedGrids: plannedGrids.workingPlane, plannedSurfacePoints: plannedGrids.surfacePoints }));
  const unplaced = plans.length === 0 ? allReadings.filter((r) => r.role === 'task').length : withoutPlan;
  const result: JudgeResult = {
    zones: worstFirst(perPlan.flatMap((r) => r.zones)),
    unassignedPoints: perPlan.reduce((n, r) => n + r.unassignedPoints, unplaced),
    hasDaylightReference: reference.some((r) => r.lux !== null),
    warnings: [...new Set(perPlan.flatMap((r) => r.warnings))],
  };
  result.warnings.push(...conditionNotes(db, survey, allReadings));
  if (withoutPlan > 0) {
    result.warnings.unshift(`${withoutPlan} task reading(s) have a position but no plan (the log named none and this site has ${plans.length} plans), so they could not be placed in any zone: give logs a plan column, or choose the plan when uploading.`);
  }
  if (plans.length === 0) result.warnings.unshift('This site has no plan with zones yet: draw zones to get verdicts.');
  if (survey.activeDecodeId === null) result.warnings.unshift('This survey has no decoded readings yet.');
  return { rule, result, readings: allReadings };
}

/** Builds the snapshot a sign-off freezes. */
export function buildFrozen(db: Db, organizationId: number, survey: SurveyRow, at: number): FrozenCompliance {
  const { rule, result, readings } = liveCompliance(db, organizationId, survey);
  const targetIds = [...new Set(result.zones.map((z) => z.targetId).filter((id): id is number => id !== null))];
  const targets = targetIds.map((id) => getVisibleTarget(db, organizationId, id)).filter((t) => t !== undefined).map(presentTarget);
  return {
    version: 1, frozenAt: at, rule, ruleText: RULE_TEXT[rule], gridRule: gridRuleText(survey.gridRounding), decodeId: survey.activeDecodeId,
    hasDaylightReference: result.hasDaylightReference, unassignedPoints: result.unassignedPoints, warnings: result.warnings,
    zones: result.zones, targets, coefficientSets: loadUsedCoefficientSets(db, readings), installation: installationOf(survey),
  };
}

export function frozenOf(survey: SurveyRow): FrozenCompliance | null {
  return survey.status === 'signed_off' && survey.frozen ? (survey.frozen as FrozenCompliance) : null;
}

export function countVerdicts(zones: Pick<ZoneCompliance, 'verdict'>[]): ComplianceCounts {
  const counts: ComplianceCounts = { meets: 0, falls_short: 0, inconclusive: 0, not_assessed: 0 };
  for (const z of zones) counts[z.verdict]++;
  return counts;
}

/** The signed-off survey of the same site just before this one (by start date, then creation). */
export function previousSignedOff(db: Db, survey: SurveyRow): SurveyRow | null {
  const candidates = db.select().from(surveys)
    .where(and(eq(surveys.siteId, survey.siteId), eq(surveys.organizationId, survey.organizationId), eq(surveys.status, 'signed_off'), ne(surveys.id, survey.id)))
    .orderBy(desc(sql`coalesce(${surveys.startedOn}, '')`), desc(surveys.createdAt), desc(surveys.id)).all();
  const key = (s: SurveyRow) => `${s.startedOn ?? ''}|${String(s.createdAt).padStart(16, '0')}|${String(s.id).padStart(10, '0')}`;
  return candidates.find((c) => key(c) < key(survey)) ?? null;
}

const siteOf = (db: Db, siteId: number) => db.select({ name: sites.name, timeZone: sites.timeZone }).from(sites).where(eq(sites.id, siteId)).get() ?? { name: '', timeZone: 'UTC' };
const userNameOf = (db: Db, id: number | null) => (id === null ? null : db.select({ name: users.name }).from(users).where(eq(users.id, id)).get()?.name ?? null);
const isoOrNull = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

const strip = ({ polygon: _p, readingIds: _r, wallBandReadingIds: _w, otherPlaneReadingIds: _o, pointDf: _d, ...zone }: JudgedZone): ZoneCompliance => zone;

/** The verdicts and judged zones of a survey: frozen if signed off, else live. */
export function surveyVerdicts(db: Db, survey: SurveyRow) {
  const frozen = frozenOf(survey);
  if (frozen) {
    return {
      rule: frozen.rule, zones: frozen.zones, unassignedPoints: frozen.unassignedPoints, hasDaylightReference: frozen.hasDaylightReference, warnings: frozen.warnings,
      installation: frozen.installation ?? IN_SERVICE, frozen,
    };
  }
  const { rule, result } = liveCompliance(db, survey.organizationId, survey);
  return {
    rule, zones: result.zones, unassignedPoints: result.unassignedPoints, hasDaylightReference: result.hasDaylightReference, warnings: result.warnings,
    installation: installationOf(survey), frozen: null,
  };
}

/** A survey's compliance answer without the caller's abilities (reports and e-mails have no caller). */
export type SurveyCompliance = Omit<ComplianceResponse, 'abilities'>;

/** The compliance answer, from verdicts the caller may already hold (so a survey is judged once). */
export function complianceOf(db: Db, survey: SurveyRow, v: ReturnType<typeof surveyVerdicts> = surveyVerdicts(db, survey)): SurveyCompliance {
  const prev = previousSignedOff(db, survey);
  const prevZones = prev ? frozenOf(prev)?.zones ?? [] : [];
  const zones = v.zones.map((z) => {
    const zone = strip(z);
    const before = prevZones.find((p) => p.zoneId === z.zoneId);
    if (!before) return zone;
    return {
      ...zone,
      change: {
        previousEavg: before.eavg,
        deltaEavg: before.eavg !== null && z.eavg !== null ? z.eavg - before.eavg : null,
        previousVerdict: before.verdict,
        verdictChanged: before.verdict !== z.verdict,
      },
    };
  });
  const site = siteOf(db, survey.siteId);
  return {
    surveyId: survey.id, surveyName: survey.name, siteId: survey.siteId, siteName: site.name, siteTimeZone: site.timeZone, startedOn: survey.startedOn,
    status: survey.status, reviewComment: survey.reviewComment,
    submittedByName: userNameOf(db, survey.submittedBy), submittedAt: isoOrNull(survey.submittedAt),
    signedOffByName: userNameOf(db, survey.signedOffBy), signedOffAt: isoOrNull(survey.signedOffAt), rule: v.rule, ruleText: RULE_TEXT[v.rule], gridRule: v.frozen?.gridRule ?? gridRuleText(survey.gridRounding),
    frozen: v.frozen !== null, frozenAt: v.frozen ? new Date(v.frozen.frozenAt).toISOString() : null, hasDaylightReference: v.hasDaylightReference,
    installation: v.installation, installationText: installationSummary(coreInstallation(v.installation)),
    counts: countVerdicts(zones), zones, unassignedPoints: v.unassignedPoints,
    previous: prev ? { surveyId: prev.id, name: prev.name, signedOffAt: prev.signedOffAt ? new Date(prev.signedOffAt).toISOString() : null } : null,
    warnings: v.warnings,
  };
}

export function getCompliance(db: Db, user: SessionUser, surveyId: number): ComplianceResponse {
  const survey = getSurveyRow(db, user, surveyId);
  return { ...complianceOf(db, survey), abilities: surveyAbilities(user, survey) };
}

/** One zone with its points (wall-band points shown, marked), statistics, target and source. */
export function getZoneDetail(db: Db, user: SessionUser, surveyId: number, zoneId: number): ZoneDetailResponse {
  const survey = getSurveyRow(db, user, surveyId);
  const verdicts = surveyVerdicts(db, survey);
  const compliance = complianceOf(db, survey, verdicts);
  const zone = compliance.zones.find((z) => z.zoneId === zoneId);
  const judged = verdicts.zones.find((z) => z.zoneId === zoneId);
  if (!zone || !judged) throw notFound('Zone of this survey');
  const wallBand = new Set(judged.wallBandReadingIds);
  const pointReadings = loadReadingsById(db, survey.id, [...judged.readingIds, ...judged.wallBandReadingIds, ...(judged.otherPlaneReadingIds ?? [])]);
  const photos = photosOfZone(db, survey.id, zoneId, pointReadings.map((r) => r.point));
  return {
    surveyId: survey.id, rule: compliance.rule, ruleText: compliance.ruleText, gridRule: compliance.gridRule, frozen: compliance.frozen,
    zone, polygon: judged.polygon,
    points: pointReadings.filter((r) => r.xM !== null && r.yM !== null).map((r) => ({
      readingId: r.id, point: r.point, xM: r.xM as number, yM: r.yM as number, timestamp: new Date(r.timeMs).toISOString(),
      lux: r.lux, uLux: r.uLux, luxBound: r.luxBound, flag: r.flag, inWallBand: wallBand.has(r.id), plane: r.plane ?? 'horizontal', azimuthDeg: r.azimuthDeg ?? null,
      ...(judged.pointDf?.[r.id] !== undefined ? { dfPercent: judged.pointDf[r.id] } : {}),
    })),
    photos, siteTimeZone: survey.site.timeZone,
  };
}

/** Each site the caller may see with its latest survey and that survey's verdict counts. */
export function sitesOverview(db: Db, user: SessionUser): SitesOverviewResponse {
  const siteRows = db.select().from(sites).where(and(...siteConditions(db, user))).orderBy(sites.name).all();
  const orgRule = decisionRuleOf(db, user.organizationId);
  const items = siteRows.map((site) => {
    // The latest survey with readings: a fresh empty draft says nothing about the rooms yet.
    // Emergency-lighting surveys are judged on their own page, not against the rooms' targets.
    const latest = db.select().from(surveys)
      .where(and(eq(surveys.siteId, site.id), sql`not exists (select 1 from ${emergencySurveys} where ${emergencySurveys.surveyId} = ${surveys.id})`))
      .orderBy(desc(sql`${surveys.activeDecodeId} is not null`), desc(sql`coalesce(${surveys.startedOn}, '')`), desc(surveys.createdAt), desc(surveys.id)).get();
    if (!latest) return { siteId: site.id, name: site.name, address: site.address, latestSurvey: null, counts: null, rule: null };
    const v = surveyVerdicts(db, latest);
    return {
      siteId: site.id, name: site.name, address: site.address,
      latestSurvey: { id: latest.id, name: latest.name, status: latest.status, startedOn: latest.startedOn },
      counts: countVerdicts(v.zones), rule: v.rule,
    };
  });
  return { items, rule: orgRule, ruleText: RULE_TEXT[orgRule] };
}

/** Our rule in words (shared/core/maintained maintenanceStatus), for the page and the README. */
export const MAINTENANCE_RULE = 'A zone is due for maintenance when its latest signed-off Eavg is below its maintained value Em, and due within a year when the least-squares line through its signed-off Eavg values falls and reaches Em within a year of the latest one. Values come from signed-off surveys only (dated by their start date, else their sign-off), exact averages only.';

/**
 * Maintenance due for the facility manager: every zone of every site the caller may see, with the
 * trend of its signed-off Eavg values (from the frozen verdicts) against its latest maintained value.
 */
export function maintenanceOverview(db: Db, user: SessionUser): MaintenanceResponse {
  const siteRows = db.select().from(sites).where(and(...siteConditions(db, user))).orderBy(sites.name).all();
  const items: MaintenanceZone[] = [];
  for (const site of siteRows) {
    const signed = db.select().from(surveys).where(and(eq(surveys.siteId, site.id), eq(surveys.status, 'signed_off'))).all();
    const byZone = new Map<number, { zone: JudgedZone; survey: SurveyRow; timeMs: number; installation: InstallationInfo }[]>();
    for (const s of signed) {
      const frozen = frozenOf(s);
      if (!frozen) continue;
      const timeMs = s.startedOn ? Date.parse(`${s.startedOn}T00:00:00Z`) : s.signedOffAt ?? frozen.frozenAt;
      for (const z of frozen.zones) {
        if (z.eavg === null || z.bounds.eavg !== null || z.targetLux === null) continue;
        byZone.set(z.zoneId, [...(byZone.get(z.zoneId) ?? []), { zone: z, survey: s, timeMs, installation: frozen.installation ?? IN_SERVICE }]);
      }
    }
    for (const [zoneId, entries] of byZone) {
      entries.sort((a, b) => a.timeMs - b.timeMs);
      const latest = entries[entries.length - 1];
      const targetLux = latest.zone.targetLux as number;
      const status = maintenanceStatus(entries.map((e) => ({ timeMs: e.timeMs, eavg: e.zone.eavg as number })), targetLux);
      items.push({
        siteId: site.id, siteName: site.name, zoneId, zoneName: latest.zone.name, planName: latest.zone.planName, targetLux,
        state: status.state, slopeLuxPerYear: status.slopeLuxPerYear,
        reachesTargetOn: status.reachesTargetAtMs === null ? null : new Date(status.reachesTargetAtMs).toISOString().slice(0, 10), reason: status.reason,
        trend: entries.map((e) => ({ surveyId: e.survey.id, surveyName: e.survey.name, date: new Date(e.timeMs).toISOString().slice(0, 10), eavg: e.zone.eavg as number, verdict: e.zone.verdict, installation: e.installation.state })),
      });
    }
  }
  const order = { due: 0, due_soon: 1, ok: 2, unknown: 3 } as const;
  items.sort((a, b) => order[a.state] - order[b.state] || a.siteName.localeCompare(b.siteName) || a.zoneName.localeCompare(b.zoneName));
  return { rule: MAINTENANCE_RULE, items };
}
