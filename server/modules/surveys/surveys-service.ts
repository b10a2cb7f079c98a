import { and, desc, eq, getTableColumns, inArray, sql, type SQL } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { decodes, logImports, readings, surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { coefficientSets } from '../../db/schema/calibration';
import { storedFiles, users } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import {
  createSurveyBodySchema, type CreateSurveyBody, type InstallationInfo, type InstallationInput, type Survey, type SurveyAbility, type SurveyDetail, type SurveyStatus,
} from '@shared/schemas/surveys';
import { surveyAbilities, surveyRefusal, type SurveyAbilitySubject } from '@shared/survey-abilities';
import { maintenanceFactor } from '@shared/core/maintained';
import { notFound, refused } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { getSiteRow, siteConditions } from '../sites/sites-service';
import { getOrganization } from '../organization/organization-service';
import { currentReadingCount, keptReadingTotal } from './reading-counts';
import type { Db } from '../../db/client';
import { computeTask, INLINE_READINGS, runComputeBySize } from '../../compute/compute-pool';

export type SurveyRow = typeof surveys.$inferSelect;
type SiteRow = typeof sites.$inferSelect;

/**
 * A survey of the organisation, or null. For services that scope by organisation only
 * (sign-off, reports); use getSurveyRow for a signed-in user, which also applies site scope.
 */
export function findSurveyInOrganization(db: Deps['db'], organizationId: number, surveyId: number): SurveyRow | null {
  return db.select().from(surveys).where(and(eq(surveys.id, surveyId), eq(surveys.organizationId, organizationId))).get() ?? null;
}

/** The survey the caller may see (organisation and, for facility managers, site scope); else a 404. */
export function getSurveyRow(db: Deps['db'], user: SessionUser, surveyId: number): SurveyRow & { site: SiteRow } {
  const row = db.select({ survey: surveys, site: sites }).from(surveys).innerJoin(sites, eq(sites.id, surveys.siteId))
    .where(and(eq(surveys.id, surveyId), ...siteConditions(db, user))).get();
  if (!row) throw notFound('Survey');
  return { ...row.survey, site: row.site };
}

/** Throws the refusal of shared/survey-abilities.ts (403, 403 four_eyes or 409) unless the user may. */
export function assertSurveyAbility(user: SessionUser, survey: SurveyAbilitySubject, ability: SurveyAbility): void {
  const refusal = surveyRefusal(user, survey, ability);
  if (refusal) throw refused(refusal);
}

/**
 * Readings that are current: those of the active decode from imports that were accepted whole, and
 * the readings typed in the field view (no import; they are carried into every new decode).
 */
export function currentReadingConditions(survey: Pick<SurveyRow, 'id' | 'activeDecodeId'>): SQL[] {
  return [
    eq(readings.decodeId, survey.activeDecodeId ?? -1),
    eq(readings.surveyId, survey.id),
    sql`(${readings.importId} is null or ${readings.importId} in (select ${logImports.id} from ${logImports} where ${logImports.surveyId} = ${survey.id} and ${logImports.status} = 'done'))`,
  ];
}

/** The survey's installation as the core's Installation and as answered (a new one always carries its MF). */
export function installationOf(row: Pick<SurveyRow, 'installation' | 'maintenanceFactor' | 'mfParts'>): InstallationInfo {
  if (row.installation === 'new' && row.maintenanceFactor !== null) return { state: 'new', maintenanceFactor: row.maintenanceFactor, parts: row.mfParts ?? null };
  return { state: 'in_service', maintenanceFactor: null, parts: null };
}

/** Columns for a new or changed installation: MF as given, else the product of its parts (CIE 97:2005). */
export function installationColumns(input: InstallationInput | undefined) {
  if (!input || input.state === 'in_service') return { installation: 'in_service' as const, maintenanceFactor: null, mfParts: null };
  const mf = input.maintenanceFactor ?? maintenanceFactor(input.parts!);
  return { installation: 'new' as const, maintenanceFactor: mf, mfParts: input.parts ?? null };
}

/**
 * Says whether the installation is new (judged against Em / MF) or in service. Not once the
 * survey is signed off: its verdicts are frozen (409).
 */
export function setInstallation(deps: Deps, actor: SessionUser, surveyId: number, input: InstallationInput): Survey {
  const row = getSurveyRow(deps.db, actor, surveyId);
  assertSurveyAbility(actor, row, 'setInstallation');
  const cols = installationColumns(input);
  const updated = deps.db.transaction((tx) => {
    const after = tx.update(surveys).set(cols).where(eq(surveys.id, row.id)).returning().get();
    recordAudit(tx, {
      organizationId: actor.organizationId, actorId: actor.id, entityType: 'survey', entityId: row.id, surveyId: row.id, action: 'installation_set',
      before: installationOf(row), after: installationOf(after), at: deps.clock.now(),
    });
    return after;
  });
  return present(updated, row.site, keptReadingTotal(deps.db, updated.id));
}

function present(row: Omit<SurveyRow, 'frozen'>, site: SiteRow, count: number): Survey {
  return {
    installation: installationOf(row),
    id: row.id, siteId: row.siteId, siteName: site.name, siteTimeZone: site.timeZone, name: row.name, startedOn: row.startedOn,
    conditions: row.conditions ?? null, status: row.status, activeDecodeId: row.activeDecodeId, readingCount: count, gridRounding: row.gridRounding,
    createdAt: new Date(row.createdAt).toISOString(),
  };
}

/** Newest first by the survey's own start date; a survey with none counts from the day it was created (UTC). */
const NEWEST_FIRST = sql`coalesce(${surveys.startedOn}, strftime('%Y-%m-%d', ${surveys.createdAt} / 1000, 'unixepoch'))`;

export function listSurveys(db: Deps['db'], user: SessionUser, filter: { siteId?: number; status?: SurveyStatus } = {}): Survey[] {
  const where = siteConditions(db, user);
  if (filter.siteId) where.push(eq(surveys.siteId, filter.siteId));
  if (filter.status) where.push(eq(surveys.status, filter.status));
  // One query; the reading counts come from the kept counts (reading-counts.ts), and the frozen snapshot is not read.
  const { frozen: _frozen, ...listed } = getTableColumns(surveys);
  const rows = db.select({ survey: listed, site: sites, readingCount: currentReadingCount }).from(surveys).innerJoin(sites, eq(sites.id, surveys.siteId))
    .where(and(...where)).orderBy(desc(NEWEST_FIRST), desc(surveys.createdAt), desc(surveys.id)).all();
  return rows.map((r) => present(r.survey, r.site, r.readingCount));
}

/** Counts over every current reading: per flag, and those taken after their calibration was due. */
function readingFacts(db: Deps['db'], survey: Pick<SurveyRow, 'id' | 'activeDecodeId'>): { flagCounts: Record<string, number>; lapsed: number } {
  if (survey.activeDecodeId === null) return { flagCounts: {}, lapsed: 0 };
  const current = currentReadingConditions(survey);
  const flagRows = db.select({ flag: readings.flag, n: sql<number>`count(*)` }).from(readings).where(and(...current)).groupBy(readings.flag).all();
  // A reading's stored flag is its most important one; lapsed calibration is read from the set it used.
  const lapsed = db.select({ n: sql<number>`count(*)` }).from(readings)
    .innerJoin(coefficientSets, eq(coefficientSets.id, readings.coefficientSetId))
    .where(and(...current, sql`${readings.timeMs} > ${coefficientSets.dueDate}`)).get()!.n;
  return { flagCounts: Object.fromEntries(flagRows.map((r) => [r.flag, r.n])), lapsed };
}

/** Declared in server/modules.ts (surveys): a large survey's counts read every reading, so on a compute thread. */
export const surveyReadingFactsTask = computeTask('survey-reading-facts', (db: Db, survey: { id: number; activeDecodeId: number | null }) => readingFacts(db, survey));

export async function getSurvey(db: Deps['db'], user: SessionUser, surveyId: number, inlineUpTo = INLINE_READINGS): Promise<SurveyDetail> {
  const row = getSurveyRow(db, user, surveyId);
  const subject = { id: row.id, activeDecodeId: row.activeDecodeId };
  const { flagCounts, lapsed } = await runComputeBySize(db, keptReadingTotal(db, row.id), surveyReadingFactsTask, subject, inlineUpTo);
  const importRows = db.select({ imp: logImports, filename: storedFiles.filename }).from(logImports).innerJoin(storedFiles, eq(storedFiles.id, logImports.fileId))
    .where(eq(logImports.surveyId, row.id)).orderBy(desc(logImports.id)).all();
  const decodeRows = db.select({ d: decodes, name: users.name }).from(decodes).leftJoin(users, eq(users.id, decodes.createdBy))
    .where(eq(decodes.surveyId, row.id)).orderBy(desc(decodes.id)).all();
  return {
    ...present(row, row.site, Object.values(flagCounts).reduce((a, b) => a + b, 0)),
    flagCounts,
    calibrationLapsedCount: lapsed,
    abilities: surveyAbilities(user, row),
    imports: importRows.map(({ imp, filename }) => ({
      id: imp.id, filename, status: imp.status, rowsRead: imp.rowsRead, readings: imp.readingCount, errorCount: imp.errors.length,
      createdAt: new Date(imp.createdAt).toISOString(),
    })),
    decodes: decodeRows.map(({ d, name }) => ({ id: d.id, reason: d.reason, createdAt: new Date(d.createdAt).toISOString(), createdByName: name, active: d.id === row.activeDecodeId })),
  };
}

export function createSurvey(deps: Deps, actor: SessionUser, input: CreateSurveyBody, status: SurveyStatus = 'draft'): Survey {
  const body = createSurveyBodySchema.parse(input);
  const site = getSiteRow(deps.db, actor, body.siteId);
  const now = deps.clock.now();
  const gridRounding = body.gridRounding ?? getOrganization(deps.db, actor.organizationId).gridRounding;
  const row = deps.db.transaction((tx) => {
    const created = tx.insert(surveys).values({
      organizationId: actor.organizationId, siteId: site.id, name: body.name, startedOn: body.startedOn ?? null,
      conditions: body.conditions ?? null, status, gridRounding, createdBy: actor.id, createdAt: now, ...installationColumns(body.installation),
    }).returning().get();
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'survey', entityId: created.id, surveyId: created.id, action: 'created', after: { ...body, gridRounding }, at: now });
    return created;
  });
  return present(row, site, 0);
}

/** Survey ids of the organisation whose current readings used any of the given coefficient sets. */
export function surveysUsingCoefficientSets(db: Deps['db'], organizationId: number, coefficientSetIds: number[]): number[] {
  if (coefficientSetIds.length === 0) return [];
  return db.selectDistinct({ id: surveys.id }).from(surveys)
    .innerJoin(readings, and(eq(readings.surveyId, surveys.id), eq(readings.decodeId, surveys.activeDecodeId)))
    .where(and(eq(surveys.organizationId, organizationId), inArray(readings.coefficientSetId, coefficientSetIds))).all().map((r) => r.id);
}
