import fs from 'node:fs';
import { and, desc, eq, ne } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { logImports } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { plans } from '../../db/schema/plans';
import { storedFiles } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import { uploadLogFieldsSchema, type ImportProblem, type ImportStatus, type ImportWarning } from '@shared/schemas/imports';
import { badRequest, conflict, notFound } from '../../http/errors';
import { keepUploadedFile, sha256OfFile, sniffFile, storedPath } from '../../lib/file-store';
import { assertSurveyAbility, getSurveyRow } from '../surveys/surveys-service';
import { enqueueImport, importOutcome, type ImportOutcome } from './import-runner';
import { markMatchingOf } from '../field/mark-placement';
import { DEFAULT_MATCH_WINDOW_MS } from '@shared/core/mark-matching';

/** Surveys being re-decoded in this process; they take no upload meanwhile. */
export const surveysBeingRedecoded = new Set<number>();

export type UploadedFile = { path: string; originalname: string; size: number };

/**
 * Accepts a log file for a survey: checks the survey (404, 409 unless draft or returned), the
 * default plan (400 unless a plan of the survey's site, 404 unknown), the content (415 unless text
 * CSV) and duplicates (409 naming the earlier import), keeps the file by content hash and queues
 * the import. Nothing is recorded for a file refused here.
 */
export async function uploadLog(deps: Deps, user: SessionUser, surveyId: number, file: UploadedFile, fields: { planId?: unknown; matchWindowS?: unknown; clockOffsetS?: unknown } = {}): Promise<{ importId: number; done: Promise<ImportOutcome> }> {
  try {
    const survey = getSurveyRow(deps.db, user, surveyId);
    assertSurveyAbility(user, survey, 'upload');
    const parsed = uploadLogFieldsSchema.safeParse(fields);
    if (!parsed.success) throw badRequest(`${parsed.error.issues[0].path.join('.')}: ${parsed.error.issues[0].message}`, parsed.error.issues);
    const sitePlans = deps.db.select({ id: plans.id, name: plans.name }).from(plans).where(eq(plans.siteId, survey.siteId)).orderBy(plans.id).all();
    const defaultPlanId = parsed.data.planId ?? null;
    if (defaultPlanId !== null && !sitePlans.some((p) => p.id === defaultPlanId)) {
      // A plan of another site of the organisation is a mistake the caller can see; anything else is unknown here.
      const elsewhere = deps.db.select({ id: plans.id }).from(plans).innerJoin(sites, eq(sites.id, plans.siteId))
        .where(and(eq(plans.id, defaultPlanId), eq(sites.organizationId, user.organizationId))).get();
      if (elsewhere) throw badRequest(`Plan ${defaultPlanId} belongs to another site than survey "${survey.name}" (${survey.site.name}): choose one of this site's plans`);
      throw notFound(`Plan ${defaultPlanId}`);
    }
    if (surveysBeingRedecoded.has(survey.id)) throw conflict('This survey is being re-decoded; upload again in a moment');
    await sniffFile(file.path, 'csv');
    const sha256 = await sha256OfFile(file.path);
    const earlier = deps.db.select({ id: logImports.id, filename: storedFiles.filename, createdAt: logImports.createdAt }).from(logImports)
      .innerJoin(storedFiles, eq(storedFiles.id, logImports.fileId))
      .where(and(eq(logImports.surveyId, survey.id), eq(storedFiles.sha256, sha256), ne(logImports.status, 'failed'))).orderBy(desc(logImports.id)).get();
    if (earlier) {
      throw conflict(`This file was already uploaded to this survey as import ${earlier.id} (${earlier.filename}, ${new Date(earlier.createdAt).toISOString().slice(0, 16).replace('T', ' ')} UTC)`, { importId: earlier.id });
    }
    const stored = await keepUploadedFile(deps, { organizationId: user.organizationId, userId: user.id, tmpPath: file.path, filename: file.originalname || 'log.csv', contentType: 'text/csv', sha256 });
    const imp = deps.db.insert(logImports).values({ surveyId: survey.id, fileId: stored.id, planId: defaultPlanId, status: 'queued', createdBy: user.id, createdAt: deps.clock.now() }).returning().get();
    const done = enqueueImport(deps, {
      importId: imp.id, surveyId: survey.id, organizationId: user.organizationId, actorId: user.id,
      filePath: storedPath(deps, stored.sha256), fileSize: stored.size, timeZone: survey.site.timeZone, plans: sitePlans, defaultPlanId,
      markMatching: { windowMs: Math.round((parsed.data.matchWindowS ?? DEFAULT_MATCH_WINDOW_MS / 1000) * 1000), clockOffsetMs: Math.round((parsed.data.clockOffsetS ?? 0) * 1000) },
    });
    return { importId: imp.id, done };
  } finally {
    fs.rmSync(file.path, { force: true });
  }
}

export function getImport(deps: Deps, user: SessionUser, importId: number): ImportStatus {
  const row = deps.db.select({ imp: logImports, filename: storedFiles.filename }).from(logImports).innerJoin(storedFiles, eq(storedFiles.id, logImports.fileId))
    .where(and(eq(logImports.id, importId), eq(storedFiles.organizationId, user.organizationId))).get();
  if (!row) throw notFound('Import');
  getSurveyRow(deps.db, user, row.imp.surveyId); // site scope
  const { imp } = row;
  return {
    id: imp.id, surveyId: imp.surveyId, filename: row.filename, planId: imp.planId, status: imp.status, progress: imp.progress, rowsRead: imp.rowsRead, readings: imp.readingCount,
    placement: imp.placement ?? null, warnings: imp.warnings as ImportWarning[], errors: imp.errors as ImportProblem[],
    createdAt: new Date(imp.createdAt).toISOString(), finishedAt: imp.finishedAt === null ? null : new Date(imp.finishedAt).toISOString(),
    markMatching: markMatchingOf(deps.db, imp.id),
  };
}

/** Waits for an import of this process to finish (seed, tests); resolves at once for a finished one. */
export async function waitForImport(deps: Deps, importId: number): Promise<void> {
  await importOutcome(deps, importId);
}
