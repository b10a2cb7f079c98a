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
import { installationSummary, maintenanceStatus } from '@shared/core/maintained';
import type { InstallationInfo } from '@shared/schemas/surveys';
import { siteConditions } from '../sites/sites-service';
import { decisionRuleOf } from '../organization/organization-service';
import { getVisibleTarget, presentTarget } from '../targets/targets-service';
import type { JudgedZone } from './judge-zones';
import { loadUsedCoefficientSets, type UsedCoefficientSet } from './compliance-repository';
import { aggregateZoneMembers, coreInstallation, currentAggregate, type StoredZone, type ZoneMembers } from './verdict-aggregates';
import { hasPointLabel, keptZonePoints, rememberZonePoints, zonePointsTask, type ZonePointsPart } from './answer-parts';
import { runCompute } from '../../compute/compute-pool';
import { packedAnswer, type PackedAnswer } from '../../http/packed-json';
import { notesOfZone, photosOfZone } from '../field/field-service';

export { coreInstallation };

/**
 * What a sign-off keeps in surveys.frozen: later target, rule or calibration changes never alter it.
 * Version 1 kept each zone's reading ids inline; version 2 keeps them in the aggregate it froze
 * (verdict_aggregate_zones, named by aggregateId), so the survey row stays small.
 */
export type FrozenCompliance = {
  version: 1 | 2;
  aggregateId?: number;
  frozenAt: number;
  rule: AcceptanceRule;
  ruleText: string;
  gridRule: string;
  decodeId: number | null;
  hasDaylightReference: boolean;
  unassignedPoints: number;
  warnings: string[];
  zones: FrozenZone[];
  targets: TargetEntry[];
  coefficientSets: UsedCoefficientSet[];
  /** New or in service (absent in sign-offs frozen before it was kept: in service). */
  installation?: InstallationInfo;
};

export type FrozenZone = StoredZone & Partial<Pick<JudgedZone, 'readingIds' | 'wallBandReadingIds' | 'otherPlaneReadingIds' | 'pointDf'>>;

const IN_SERVICE: InstallationInfo = { state: 'in_service', maintenanceFactor: null, parts: null };


/** Builds the snapshot a sign-off freezes, from the survey's current aggregate (freeze that aggregate in the same transaction). */
export async function buildFrozen(db: Db, organizationId: number, survey: SurveyRow, at: number): Promise<FrozenCompliance> {
  const { id, summary } = await currentAggregate(db, survey, at);
  const targetIds = [...new Set(summary.zones.map((z) => z.targetId).filter((t): t is number => t !== null))];
  const targets = targetIds.map((t) => getVisibleTarget(db, organizationId, t)).filter((t) => t !== undefined).map(presentTarget);
  return {
    version: 2, frozenAt: at, rule: summary.rule, ruleText: RULE_TEXT[summary.rule], gridRule: gridRuleText(survey.gridRounding), decodeId: survey.activeDecodeId, aggregateId: id,
    hasDaylightReference: summary.hasDaylightReference, unassignedPoints: summary.unassignedPoints, warnings: summary.warnings,
    zones: summary.zones, targets, coefficientSets: loadUsedCoefficientSets(db, summary.coefficientSetReadings), installation: installationOf(survey),
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

const strip = ({ polygon: _p, readingIds: _r, wallBandReadingIds: _w, otherPlaneReadingIds: _o, pointDf: _d, ...zone }: FrozenZone): ZoneCompliance => zone;

export type SurveyVerdicts = {
  rule: AcceptanceRule; zones: FrozenZone[]; unassignedPoints: number; hasDaylightReference: boolean; warnings: string[]; installation: InstallationInfo;
  frozen: FrozenCompliance | null; aggregateId: number | null; coefficientSetReadings: [number, number][] | null;
};

/** The verdicts and judged zones of a survey: frozen if signed off, else from its current aggregate. */
export async function surveyVerdicts(db: Db, survey: SurveyRow): Promise<SurveyVerdicts> {
  const frozen = frozenOf(survey);
  if (frozen) {
    return {
      rule: frozen.rule, zones: frozen.zones, unassignedPoints: frozen.unassignedPoints, hasDaylightReference: frozen.hasDaylightReference, warnings: frozen.warnings,
      installation: frozen.installation ?? IN_SERVICE, frozen, aggregateId: frozen.aggregateId ?? null, coefficientSetReadings: null,
    };
  }
  const { id, summary } = await currentAggregate(db, survey);
  return {
    rule: summary.rule, zones: summary.zones, unassignedPoints: summary.unassignedPoints, hasDaylightReference: summary.hasDaylightReference, warnings: summary.warnings,
    installation: installationOf(survey), frozen: null, aggregateId: id, coefficientSetReadings: summary.coefficientSetReadings,
  };
}

/** A survey's compliance answer without the caller's abilities (reports and e-mails have no caller). */
export type SurveyCompliance = Omit<ComplianceResponse, 'abilities'>;

/** The readings a judged zone used (inline in sign-offs frozen before version 2, else in its aggregate). */
export function zoneMembers(db: Db, v: Pick<SurveyVerdicts, 'aggregateId'>, zone: FrozenZone): ZoneMembers {
  if (zone.readingIds) return { readingIds: zone.readingIds, wallBandReadingIds: zone.wallBandReadingIds ?? [], otherPlaneReadingIds: zone.otherPlaneReadingIds ?? [], pointDf: zone.pointDf ?? {} };
  return v.aggregateId === null ? { readingIds: [], wallBandReadingIds: [], otherPlaneReadingIds: [], pointDf: {} } : aggregateZoneMembers(db, v.aggregateId, zone.zoneId);
}

/** The compliance answer, from verdicts the caller may already hold (so a survey is judged once). */
export async function complianceOf(db: Db, survey: SurveyRow, verdicts?: SurveyVerdicts): Promise<SurveyCompliance> {
  const v = verdicts ?? await surveyVerdicts(db, survey);
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

export async function getCompliance(db: Db, user: SessionUser, surveyId: number): Promise<ComplianceResponse> {
  const survey = getSurveyRow(db, user, surveyId);
  return { ...await complianceOf(db, survey), abilities: surveyAbilities(user, survey) };
}

/**
 * One zone with its points (wall-band points shown, marked), statistics, target and source. The
 * points come packed from a compute thread and are kept per aggregate (answer-parts.ts); the
 * photos and notes, which are no input of the verdicts, are read on every request.
 */
export async function getZoneDetail(db: Db, user: SessionUser, surveyId: number, zoneId: number): Promise<PackedAnswer<ZoneDetailResponse>> {
  const survey = getSurveyRow(db, user, surveyId);
  for (let attempt = 0; ; attempt++) {
    const verdicts = await surveyVerdicts(db, survey);
    const compliance = await complianceOf(db, survey, verdicts);
    const zone = compliance.zones.find((z) => z.zoneId === zoneId);
    const judged = verdicts.zones.find((z) => z.zoneId === zoneId);
    if (!zone || !judged) throw notFound('Zone of this survey');
    const part = await zonePointsOf(db, survey.id, verdicts, judged);
    // The aggregate was replaced while its points were read: ask again (as currentAggregate does).
    if (!part) {
      if (attempt >= 2) throw new Error(`The verdicts of survey ${survey.id} kept changing while zone ${zoneId} was read`);
      continue;
    }
    return packedAnswer(part.points, {
      surveyId: survey.id, rule: compliance.rule, ruleText: compliance.ruleText, gridRule: compliance.gridRule, frozen: compliance.frozen,
      zone, polygon: judged.polygon,
      photos: photosOfZone(db, survey.id, zoneId, (label) => hasPointLabel(part, label)), notes: notesOfZone(db, survey.id, zoneId), siteTimeZone: survey.site.timeZone,
    });
  }
}

/** A judged zone's packed points: kept beside its aggregate, else built (and kept) on a compute thread (null: that aggregate is gone). */
async function zonePointsOf(db: Db, surveyId: number, v: SurveyVerdicts, zone: FrozenZone): Promise<ZonePointsPart | null> {
  // Sign-offs frozen before version 2 name their readings inline: rare and old, built each time.
  if (zone.readingIds || v.aggregateId === null) return runCompute(db, zonePointsTask, { surveyId, members: zoneMembers(db, v, zone) });
  const kept = keptZonePoints(db, v.aggregateId, zone.zoneId);
  if (kept) return kept;
  const built = await runCompute(db, zonePointsTask, { surveyId, aggregateId: v.aggregateId, zoneId: zone.zoneId });
  if (built) rememberZonePoints(db, v.aggregateId, zone.zoneId, built);
  return built;
}

/** Each site the caller may see with its latest survey and that survey's verdict counts. */
export async function sitesOverview(db: Db, user: SessionUser): Promise<SitesOverviewResponse> {
  const siteRows = db.select().from(sites).where(and(...siteConditions(db, user))).orderBy(sites.name).all();
  const orgRule = decisionRuleOf(db, user.organizationId);
  const items = [];
  for (const site of siteRows) {
    // The latest survey with readings: a fresh empty draft says nothing about the rooms yet.
    // Emergency-lighting surveys are judged on their own page, not against the rooms' targets.
    const latest = db.select().from(surveys)
      .where(and(eq(surveys.siteId, site.id), sql`not exists (select 1 from ${emergencySurveys} where ${emergencySurveys.surveyId} = ${surveys.id})`))
      .orderBy(desc(sql`${surveys.activeDecodeId} is not null`), desc(sql`coalesce(${surveys.startedOn}, '')`), desc(surveys.createdAt), desc(surveys.id)).get();
    if (!latest) { items.push({ siteId: site.id, name: site.name, address: site.address, latestSurvey: null, counts: null, rule: null }); continue; }
    const v = await surveyVerdicts(db, latest);
    items.push({
      siteId: site.id, name: site.name, address: site.address,
      latestSurvey: { id: latest.id, name: latest.name, status: latest.status, startedOn: latest.startedOn },
      counts: countVerdicts(v.zones), rule: v.rule,
    });
  }
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
    const byZone = new Map<number, { zone: FrozenZone; survey: SurveyRow; timeMs: number; installation: InstallationInfo }[]>();
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
