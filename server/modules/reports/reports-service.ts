import type { Response } from 'express';
import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { and, asc, eq, type SQL } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { readings } from '../../db/schema/surveys';
import { coefficientSets, probes } from '../../db/schema/calibration';
import { plans } from '../../db/schema/plans';
import { emergencySurveys } from '../../db/schema/emergency';
import { conflict } from '../../http/errors';
import { toSafeCsv, toSafeCsvRows } from '@shared/csv-safe';
import { readingCells, readingColumns, statBoundCell, ZONE_COLUMNS, type ExportUnit } from '@shared/export-columns';
import { VERDICT_LABELS } from '@shared/schemas/compliance';
import { labelOfUseType } from '@shared/schemas/zones';
import type { SessionUser } from '@shared/schemas/auth';
import type { SendReportBody, SendReportResponse } from '@shared/schemas/reports';
import { currentReadingConditions, findSurveyInOrganization, getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { exportColumns, fromInTimeOrder } from '../readings/readings-service';
import { recordAudit } from '../audit/audit-service';
import { frozenOf, surveyVerdicts, complianceOf, zoneMembers } from '../compliance/compliance-service';
import type { ReportUnit } from './report-pdf';
import { reportFilename, type FileAnswer } from './report-files';
import { surveyReportPdf } from './report-job';

export type { FileAnswer };
export { reportFilename };

export function reportPdfFor(deps: Deps, user: SessionUser, surveyId: number, unit: ReportUnit) {
  return surveyReportPdf(deps, getSurveyRow(deps.db, user, surveyId), unit);
}

/** The zone table as CSV, lux throughout, full precision, each statistic's bound in its own column (shared/export-columns). */
export async function zonesCsv(db: Db, user: SessionUser, surveyId: number): Promise<FileAnswer> {
  const survey = getSurveyRow(db, user, surveyId);
  const c = await complianceOf(db, survey);
  // One row per zone (check "task_plane"), then one per further check of it (walls, ceiling, cylindrical, the areas around a task).
  const mf = c.installation.maintenanceFactor;
  const rows = c.zones.flatMap((z) => [[
    z.name, 'task_plane', z.planName, z.kind, z.useType, labelOfUseType(z.useType), z.targetName, z.targetSource, z.targetConfidence, z.requiredLux ?? null, z.modifiedLux ?? null, z.targetLux,
    z.design?.basis ?? null, c.installation.state, mf, z.limitLux ?? z.targetLux, z.targetU0, z.points, z.requiredPoints,
    z.gridRuleApplies === false ? 'not applied (outdoor area)' : 'applied', z.wallBandPoints,
    z.eavg, statBoundCell(z.eavg, z.bounds.eavg), z.uEavg, z.emin, statBoundCell(z.emin, z.bounds.emin), z.emax, z.u0, statBoundCell(z.u0, z.bounds.u0),
    z.modelling?.ratio ?? null, z.dfAvg ?? null,
    VERDICT_LABELS[z.verdict], z.change?.deltaEavg ?? null, z.change ? VERDICT_LABELS[z.change.previousVerdict] : null, c.rule, z.reasons.join(' '),
  ], ...(z.checks ?? []).map((k) => [
    z.name, k.kind, z.planName, z.kind, z.useType, labelOfUseType(z.useType), z.targetName, k.source, k.confidence, null, null, k.targetLux,
    null, c.installation.state, mf, k.limitLux, k.u0Min, k.points, null,
    null, null,
    k.eavg, statBoundCell(k.eavg, k.bounds.eavg), k.uEavg, k.emin, statBoundCell(k.emin, k.bounds.emin), null, k.u0, statBoundCell(k.u0, k.bounds.u0),
    null, null,
    VERDICT_LABELS[k.verdict], null, null, c.rule, k.reasons.join(' '),
  ])]);
  return { filename: reportFilename(survey, 'csv', 'zones'), contentType: 'text/csv; charset=utf-8', content: Buffer.from(toSafeCsv(ZONE_COLUMNS, rows), 'utf8') };
}

/** Rows per page of the streamed readings CSV: each page is one short stretch of the event loop. */
const CSV_PAGE = 1000;

/**
 * Every reading the verdicts used (the frozen decode once signed off) with its zone, in the export
 * vocabulary (shared/export-columns), streamed a page at a time (keyset on time and id) and
 * yielding between pages, so a survey of any size never holds the event loop or the whole file.
 */
export async function streamReadingsCsv(db: Db, user: SessionUser, surveyId: number, unit: ExportUnit, res: Response): Promise<void> {
  const survey = getSurveyRow(db, user, surveyId);
  const v = await surveyVerdicts(db, survey);
  const frozen = frozenOf(survey);
  const where: SQL[] | null = frozen
    ? frozen.decodeId === null ? null : [eq(readings.surveyId, survey.id), eq(readings.decodeId, frozen.decodeId)]
    : survey.activeDecodeId === null ? null : currentReadingConditions(survey);
  const zoneOf = new Map<number, { zone: string; inWallBand: boolean }>();
  for (const z of v.zones) {
    const members = zoneMembers(db, v, z);
    const inside = { zone: z.name, inWallBand: false };
    const band = { zone: z.name, inWallBand: true };
    for (const id of members.readingIds) zoneOf.set(id, inside);
    for (const id of members.wallBandReadingIds) zoneOf.set(id, band);
    await yieldToEventLoop();
  }
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${reportFilename(survey, 'csv', `readings-${unit}`)}"`);
  res.setHeader('Cache-Control', 'private, no-store');
  res.write(`${toSafeCsvRows([readingColumns(unit, true)])}\r\n`);
  let after = { timeMs: Number.MIN_SAFE_INTEGER, id: 0 };
  while (where !== null) {
    const rows = db.select(exportColumns).from(readings).innerJoin(probes, eq(probes.id, readings.probeId)).leftJoin(plans, eq(plans.id, readings.planId))
      .leftJoin(coefficientSets, eq(coefficientSets.id, readings.coefficientSetId))
      .where(and(...where, fromInTimeOrder(after, 'asc', 'after')))
      .orderBy(asc(readings.timeMs), asc(readings.id)).limit(CSV_PAGE).all();
    if (rows.length === 0) break;
    const chunk = toSafeCsvRows(rows.map((r) => readingCells(r, unit, zoneOf.get(r.id) ?? { zone: null, inWallBand: null })));
    if (!res.write(`${chunk}\r\n`)) await new Promise((resolve) => res.once('drain', resolve));
    const last = rows[rows.length - 1];
    after = { timeMs: last.timeMs, id: last.id };
    await yieldToEventLoop();
  }
  res.end();
}

/** The attachment kind a queued message names to have the report PDF built at delivery. */
export const REPORT_ATTACHMENT = 'survey_report';

/** A pending attachment: the survey's report PDF, built when the message is delivered. */
export function reportAttachment(survey: Pick<SurveyRow, 'id' | 'name' | 'organizationId'>, unit: ReportUnit = 'lx') {
  return { kind: REPORT_ATTACHMENT, filename: reportFilename(survey, 'pdf'), params: { surveyId: survey.id, organizationId: survey.organizationId, unit } };
}

/** Builds a queued message's report PDF from the survey as it is then (the frozen record once signed off). */
export function registerReportAttachment(deps: Deps) {
  deps.mailer.attachmentBuilder(REPORT_ATTACHMENT, async (params) => {
    const { surveyId, organizationId, unit } = params as { surveyId: number; organizationId: number; unit: ReportUnit };
    const survey = findSurveyInOrganization(deps.db, organizationId, surveyId);
    if (!survey) throw new Error(`Survey ${surveyId} no longer exists; its report cannot be attached`);
    return surveyReportPdf(deps, survey, unit);
  });
}

/**
 * Queues the report for the chosen recipients with the audit entry, in one transaction; the PDF is
 * built when the message is delivered, so the request does not wait for it (or for the mail server).
 */
export function sendReport(deps: Deps, user: SessionUser, surveyId: number, body: SendReportBody): SendReportResponse {
  const survey = getSurveyRow(deps.db, user, surveyId);
  // This is the zones' report; an emergency survey's own report goes out with its sign-off.
  if (deps.db.select({ surveyId: emergencySurveys.surveyId }).from(emergencySurveys).where(eq(emergencySurveys.surveyId, survey.id)).get()) {
    throw conflict(`"${survey.name}" is an emergency lighting survey: its report is the emergency report, e-mailed with its sign-off and downloaded from its own page, not the zone report sent from here`, { reason: 'emergency_survey' });
  }
  const recipients = [...new Set(body.recipients)];
  const status = survey.status === 'signed_off' ? 'signed off' : `${survey.status.replace('_', ' ')} (not yet signed off: verdicts are provisional)`;
  const attachment = reportAttachment(survey);
  const messageId = deps.db.transaction((tx) => {
    const id = deps.mailer.queue(tx, {
      to: recipients,
      organizationId: user.organizationId,
      subject: `Lighting survey report: ${survey.site.name}, ${survey.name}`,
      text: `${user.name} (${user.organizationName}) sent you the Luxtrail report for "${survey.name}" at ${survey.site.name}, ${status}.\n`
        + `${body.message ? `\nTheir message:\n${body.message}\n` : ''}\nThe report is attached as a PDF. It supports decisions about lighting; it does not certify emergency lighting, and local codes and qualified lighting professionals take precedence.\n`,
      pendingAttachments: [attachment],
    });
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'report_sent', after: { recipients, filename: attachment.filename, messageId: id }, at: deps.clock.now() });
    return id;
  });
  return { sentTo: recipients, filename: attachment.filename, messageId };
}
