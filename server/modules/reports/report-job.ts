import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import type { Deps } from '../../deps';
import { surveys } from '../../db/schema/surveys';
import type { SessionUser } from '@shared/schemas/auth';
import type { ReportJobState } from '@shared/schemas/reports';
import { computeTask, runCompute } from '../../compute/compute-pool';
import { conflict, notFound } from '../../http/errors';
import type { SurveyRow } from '../surveys/surveys-service';
import { getSurveyRow } from '../surveys/surveys-service';
import { loadReportData } from './report-data';
import { reportFilename, type FileAnswer } from './report-files';
import { reportPhotos, reportZoneNotes, type ReportPhoto } from '../field/field-photos';
import { conditionNotes, sessionsForReport } from '../field/field-service';
import { WARM_UP_MS } from '@shared/core/field-conditions';
import type { FieldSession } from '@shared/schemas/field';
import { renderReportPdf, type ReportUnit } from './report-pdf';

/** What a sign-off about to commit passes, so the attached report is exactly what it freezes. */
type SignedState = Pick<SurveyRow, 'status' | 'signedOffBy' | 'signedOffAt' | 'reviewComment' | 'frozen'>;
/** The field view's photos (the appendix) and visits (their conditions) travel with the input: the thread has no file store. */
type ReportPdfInput = { surveyId: number; unit: ReportUnit; now: number; signed?: SignedState; photos: ReportPhoto[]; sessions: FieldSession[] };

/** The compute task: loads the report's data (verdicts, each zone's readings) and renders it. */
async function buildReportPdf(db: Db, input: ReportPdfInput, progress: (f: number) => void): Promise<Uint8Array> {
  const row = db.select().from(surveys).where(eq(surveys.id, input.surveyId)).get();
  if (!row) throw new Error(`Survey ${input.surveyId} does not exist`);
  progress(0.05);
  const survey = input.signed ? { ...row, ...input.signed } : row;
  const data = await loadReportData(db, survey, input.now, { allPoints: input.sessions.length > 0 });
  // Notes on readings the visits' conditions put in doubt (before lights on, warm-up, burn-in, daylight).
  const judged = () => data.zones.flatMap((z) => z.readings.concat(z.wallBandReadings));
  const fieldConditions = input.sessions.length ? { sessions: input.sessions, warmUpMinutes: WARM_UP_MS / 60_000, notes: conditionNotes(db, survey, judged()) } : undefined;
  progress(0.4);
  const pdf = await renderReportPdf({ ...data, photos: input.photos, zoneNotes: reportZoneNotes(db, survey.id), fieldConditions }, input.unit, (done, total) => progress(0.4 + 0.6 * (done / Math.max(1, total))));
  return new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength);
}

/** Declared in server/modules.ts (reports), so the pool threads can run it. */
export const reportPdfTask = computeTask('report-pdf', buildReportPdf, { wholeSurvey: true });

/** The PDF report of a survey (frozen verdicts once signed off), built off the request's thread. */
export async function surveyReportPdf(deps: Deps, survey: SurveyRow, unit: ReportUnit = 'lx', onProgress?: (f: number) => void): Promise<FileAnswer> {
  const signed = survey.status === 'signed_off' ? { status: survey.status, signedOffBy: survey.signedOffBy, signedOffAt: survey.signedOffAt, reviewComment: survey.reviewComment, frozen: survey.frozen } : undefined;
  const extras = { photos: reportPhotos(deps, survey.id), sessions: sessionsForReport(deps.db, survey.id) };
  const bytes = await runCompute(deps.db, reportPdfTask, { surveyId: survey.id, unit, now: deps.clock.now(), ...extras, ...(signed ? { signed } : {}) }, onProgress);
  return { filename: reportFilename(survey, 'pdf'), contentType: 'application/pdf', content: Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength) };
}

/**
 * Report jobs: the PDF of a large survey takes seconds, so the client starts a job, polls its
 * progress and then fetches the file. Kept in this process's memory for JOB_TTL_MS after they
 * finish (a restart forgets them; the client starts again). A database-backed queue could keep
 * them instead behind the same three functions.
 */
type ReportJob = ReportJobState & { organizationId: number; userId: number; surveyId: number; unit: ReportUnit; file?: FileAnswer; finishedAtMs?: number };
const JOB_TTL_MS = 10 * 60_000;
const jobs = new Map<string, ReportJob>();

function present(job: ReportJob): ReportJobState {
  return { id: job.id, surveyId: job.surveyId, status: job.status, progress: job.progress, filename: job.filename, size: job.size, error: job.error };
}

function prune(now: number) {
  for (const [id, job] of jobs) if (job.finishedAtMs !== undefined && now - job.finishedAtMs > JOB_TTL_MS) jobs.delete(id);
}

/** Starts building a survey's PDF (or answers the same user's job for it still running). */
export function startReportJob(deps: Deps, user: SessionUser, surveyId: number, unit: ReportUnit): ReportJobState {
  const survey = getSurveyRow(deps.db, user, surveyId);
  prune(Date.now());
  for (const job of jobs.values()) {
    if (job.userId === user.id && job.surveyId === survey.id && job.unit === unit && job.status === 'running') return present(job);
  }
  const job: ReportJob = {
    id: randomUUID(), organizationId: user.organizationId, userId: user.id, surveyId: survey.id, unit,
    status: 'running', progress: 0, filename: reportFilename(survey, 'pdf'), size: null, error: null,
  };
  jobs.set(job.id, job);
  surveyReportPdf(deps, survey, unit, (f) => { job.progress = Math.max(job.progress, Math.min(0.99, f)); }).then((file) => {
    Object.assign(job, { status: 'done', progress: 1, file, size: file.content.length, finishedAtMs: Date.now() });
  }, (err: unknown) => {
    console.error(`Report job ${job.id} failed`, err);
    Object.assign(job, { status: 'failed', error: 'The report could not be built; try again, and tell your administrator if it fails again.', finishedAtMs: Date.now() });
  });
  return present(job);
}

function findJob(user: SessionUser, jobId: string): ReportJob {
  const job = jobs.get(jobId);
  if (!job || job.organizationId !== user.organizationId) throw notFound('Report job');
  return job;
}

export function reportJobState(user: SessionUser, jobId: string): ReportJobState {
  return present(findJob(user, jobId));
}

export function reportJobFile(user: SessionUser, jobId: string): FileAnswer {
  const job = findJob(user, jobId);
  if (job.status !== 'done' || !job.file) throw conflict(job.status === 'failed' ? 'This report job failed; start a new one' : 'This report is still being built; poll the job until it is done');
  return job.file;
}
