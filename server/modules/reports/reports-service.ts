import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { readings } from '../../db/schema/surveys';
import { probes } from '../../db/schema/calibration';
import { toSafeCsv } from '@shared/csv-safe';
import { VERDICT_LABELS } from '@shared/schemas/compliance';
import type { SessionUser } from '@shared/schemas/auth';
import type { SendReportBody, SendReportResponse } from '@shared/schemas/reports';
import { getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { recordAudit } from '../audit/audit-service';
import { frozenOf, surveyVerdicts, complianceOf } from '../compliance/compliance-service';
import { loadCurrentReadings } from '../compliance/compliance-repository';
import { loadReportData } from './report-data';
import { renderReportPdf, type ReportUnit } from './report-pdf';

export type FileAnswer = { filename: string; contentType: string; content: Buffer };

const slug = (s: string) => s.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'survey';
export const reportFilename = (survey: Pick<SurveyRow, 'id' | 'name'>, ext: string, what = 'report') => `luxtrail-${what}-${survey.id}-${slug(survey.name)}.${ext}`;

/** The PDF report of a survey (frozen verdicts once signed off). */
export async function surveyReportPdf(deps: Deps, survey: SurveyRow, unit: ReportUnit = 'lx'): Promise<FileAnswer> {
  const content = await renderReportPdf(loadReportData(deps.db, survey, deps.clock.now()), unit);
  return { filename: reportFilename(survey, 'pdf'), contentType: 'application/pdf', content };
}

export function reportPdfFor(deps: Deps, user: SessionUser, surveyId: number, unit: ReportUnit) {
  return surveyReportPdf(deps, getSurveyRow(deps.db, user, surveyId), unit);
}

/** The zone table as CSV, lux throughout, formula-like text neutralised (shared/csv-safe). */
export function zonesCsv(db: Db, user: SessionUser, surveyId: number): FileAnswer {
  const survey = getSurveyRow(db, user, surveyId);
  const c = complianceOf(db, survey);
  // One row per zone (check "task_plane"), then one per further check of it (walls, ceiling, cylindrical, the areas around a task).
  const header = ['zone', 'check', 'plan', 'kind', 'use_type', 'target', 'target_source', 'target_confidence', 'required_em_lx', 'modified_em_lx', 'em_lx', 'design_basis',
    'installation', 'maintenance_factor', 'limit_lx', 'u0_min', 'points', 'required_points', 'wall_band_points',
    'eavg_lx', 'u_eavg_lx_k2', 'emin_lx', 'emax_lx', 'u0', 'modelling_ez_over_eh', 'df_avg_percent', 'verdict', 'delta_eavg_lx', 'previous_verdict', 'decision_rule', 'reasons'];
  const mf = c.installation.maintenanceFactor;
  const rows = c.zones.flatMap((z) => [[
    z.name, 'task_plane', z.planName, z.kind, z.useType, z.targetName, z.targetSource, z.targetConfidence, z.requiredLux ?? null, z.modifiedLux ?? null, z.targetLux, z.design?.basis ?? null,
    c.installation.state, mf, z.limitLux ?? z.targetLux, z.targetU0, z.points, z.requiredPoints, z.wallBandPoints,
    z.eavg, z.uEavg, z.emin, z.emax, z.u0, z.modelling?.ratio ?? null, z.dfAvg ?? null,
    VERDICT_LABELS[z.verdict], z.change?.deltaEavg ?? null, z.change ? VERDICT_LABELS[z.change.previousVerdict] : null, c.rule, z.reasons.join(' '),
  ], ...(z.checks ?? []).map((k) => [
    z.name, k.kind, z.planName, z.kind, z.useType, z.targetName, k.source, k.confidence, null, null, k.targetLux, null,
    c.installation.state, mf, k.limitLux, k.u0Min, k.points, null, null,
    k.eavg, k.uEavg, k.emin, null, k.u0, null, null,
    VERDICT_LABELS[k.verdict], null, null, c.rule, k.reasons.join(' '),
  ])]);
  return { filename: reportFilename(survey, 'csv', 'zones'), contentType: 'text/csv; charset=utf-8', content: Buffer.from(toSafeCsv(header, rows), 'utf8') };
}

/** Every reading the verdicts used (the frozen decode once signed off), with its zone. */
export function readingsCsv(db: Db, user: SessionUser, surveyId: number): FileAnswer {
  const survey = getSurveyRow(db, user, surveyId);
  const v = surveyVerdicts(db, survey);
  const frozen = frozenOf(survey);
  const rows = frozen
    ? frozen.decodeId === null ? [] : db.select().from(readings).where(and(eq(readings.surveyId, survey.id), eq(readings.decodeId, frozen.decodeId))).orderBy(asc(readings.timeMs), asc(readings.id)).all()
    : loadCurrentReadings(db, survey);
  const zoneOf = new Map<number, { name: string; wallBand: boolean }>();
  for (const z of v.zones) {
    for (const id of z.readingIds) zoneOf.set(id, { name: z.name, wallBand: false });
    for (const id of z.wallBandReadingIds) zoneOf.set(id, { name: z.name, wallBand: true });
  }
  const probeIds = [...new Set(rows.map((r) => r.probeId))];
  const serials = new Map(probeIds.length ? db.select({ id: probes.id, serial: probes.serial }).from(probes).where(inArray(probes.id, probeIds)).all().map((p) => [p.id, p.serial]) : []);
  const header = ['reading_id', 'point', 'zone', 'in_wall_band', 'x_m', 'y_m', 'role', 'timestamp', 'probe', 'lux', 'u_lux_k2', 'lux_bound', 'flag', 'coefficient_set_id'];
  const data = rows.map((r) => {
    const z = zoneOf.get(r.id);
    return [r.id, r.point, z?.name ?? null, z ? (z.wallBand ? 'yes' : 'no') : null, r.xM, r.yM, r.role, new Date(r.timeMs).toISOString(), serials.get(r.probeId) ?? String(r.probeId),
      r.lux === null ? null : round(r.lux, 3), r.uLux === null ? null : round(r.uLux, 3), r.luxBound, r.flag, r.coefficientSetId];
  });
  return { filename: reportFilename(survey, 'csv', 'readings'), contentType: 'text/csv; charset=utf-8', content: Buffer.from(toSafeCsv(header, data), 'utf8') };
}

function round(v: number | null, digits = 1): number | null {
  return v === null ? null : Number(v.toFixed(digits));
}

/** E-mails the PDF report to the chosen recipients through the mailer (the local outbox by default). */
export async function sendReport(deps: Deps, user: SessionUser, surveyId: number, body: SendReportBody): Promise<SendReportResponse> {
  const survey = getSurveyRow(deps.db, user, surveyId);
  const pdf = await surveyReportPdf(deps, survey);
  const recipients = [...new Set(body.recipients)];
  const status = survey.status === 'signed_off' ? 'signed off' : `${survey.status.replace('_', ' ')} (not yet signed off: verdicts are provisional)`;
  await deps.mailer.send({
    to: recipients,
    organizationId: user.organizationId,
    subject: `Lighting survey report: ${survey.site.name}, ${survey.name}`,
    text: `${user.name} (${user.organizationName}) sent you the Luxtrail report for "${survey.name}" at ${survey.site.name}, ${status}.\n`
      + `${body.message ? `\nTheir message:\n${body.message}\n` : ''}\nThe report is attached as a PDF. It supports decisions about lighting; it does not certify emergency lighting, and local codes and qualified lighting professionals take precedence.\n`,
    attachments: [pdf],
  });
  deps.db.transaction((tx) => {
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'report_sent', after: { recipients, filename: pdf.filename, size: pdf.content.length }, at: deps.clock.now() });
  });
  return { sentTo: recipients, filename: pdf.filename, size: pdf.content.length };
}
