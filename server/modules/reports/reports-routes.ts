import type { Response } from 'express';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { reportJobBodySchema, reportJobParamsSchema, reportJobStateSchema, reportUnitQuerySchema, sendReportBodySchema, sendReportResponseSchema } from '@shared/schemas/reports';
import { registerReportAttachment, reportPdfFor, sendReport, streamReadingsCsv, zonesCsv, type FileAnswer } from './reports-service';
import { reportJobFile, reportJobState, startReportJob } from './report-job';

/** Sends a file answer as a download, never cached. */
export function sendFile(res: Response, file: FileAnswer) {
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', `attachment; filename="${file.filename}"`);
  res.setHeader('Cache-Control', 'private, no-store');
  res.send(file.content);
}

export function registerReportRoutes(api: Api, deps: Deps) {
  registerReportAttachment(deps);

  api.route({ method: 'get', path: '/surveys/:id/report.pdf', access: 'surveys.read', tag: 'reports', summary: 'The survey report as PDF (unit=lx|fc), built on a compute thread; for a large survey start a report job instead', params: idParamsSchema, query: reportUnitQuerySchema, produces: 'application/pdf' },
    async ({ user, params, query, res }) => { sendFile(res, await reportPdfFor(deps, user, params.id, query.unit)); });

  api.route({ method: 'get', path: '/surveys/:id/compliance/zones.csv', access: 'surveys.read', tag: 'reports', summary: 'The zone table as CSV (formula cells neutralised)', params: idParamsSchema, produces: 'text/csv' },
    async ({ user, params, res }) => { sendFile(res, await zonesCsv(deps.db, user, params.id)); });

  api.route({ method: 'get', path: '/surveys/:id/compliance/readings.csv', access: 'surveys.read', tag: 'reports', summary: 'The readings the verdicts used, with their zones, as CSV (unit=lx|fc, streamed)', params: idParamsSchema, query: reportUnitQuerySchema, produces: 'text/csv' },
    ({ user, params, query, res }) => streamReadingsCsv(deps.db, user, params.id, query.unit, res));

  api.route({ method: 'post', path: '/surveys/:id/report-jobs', access: 'surveys.read', tag: 'reports', summary: 'Start building the PDF report off the request path (unit=lx|fc); poll the job, then fetch its file', params: idParamsSchema, body: reportJobBodySchema, status: 202, response: reportJobStateSchema },
    ({ user, params, body }) => startReportJob(deps, user, params.id, body.unit));

  api.route({ method: 'get', path: '/report-jobs/:jobId', access: 'surveys.read', tag: 'reports', summary: 'A report job: running with its progress (0 to 1), done, or failed', params: reportJobParamsSchema, response: reportJobStateSchema },
    ({ user, params }) => reportJobState(user, params.jobId));

  api.route({ method: 'get', path: '/report-jobs/:jobId/file', access: 'surveys.read', tag: 'reports', summary: 'The PDF a finished report job built (409 while it runs)', params: reportJobParamsSchema, produces: 'application/pdf' },
    ({ user, params, res }) => { sendFile(res, reportJobFile(user, params.jobId)); });

  api.route({ method: 'post', path: '/surveys/:id/report/send', access: 'reports.send', tag: 'reports', summary: 'E-mail the PDF report to chosen recipients (queued: the PDF is built and sent in the background)', params: idParamsSchema, body: sendReportBodySchema, status: 202, response: sendReportResponseSchema },
    ({ user, params, body }) => sendReport(deps, user, params.id, body));
}
