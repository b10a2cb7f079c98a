import { z } from 'zod';
import type { Response } from 'express';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { sendReportBodySchema, sendReportResponseSchema } from '@shared/schemas/reports';
import { readingsCsv, registerReportAttachment, reportPdfFor, sendReport, zonesCsv, type FileAnswer } from './reports-service';

const reportQuerySchema = z.object({ unit: z.enum(['lx', 'fc']).default('lx') });

/** Sends a file answer as a download, never cached. */
export function sendFile(res: Response, file: FileAnswer) {
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', `attachment; filename="${file.filename}"`);
  res.setHeader('Cache-Control', 'private, no-store');
  res.send(file.content);
}

export function registerReportRoutes(api: Api, deps: Deps) {
  registerReportAttachment(deps);

  api.route({ method: 'get', path: '/surveys/:id/report.pdf', access: 'surveys.read', tag: 'reports', summary: 'The survey report as PDF (unit=lx|fc)', params: idParamsSchema, query: reportQuerySchema, produces: 'application/pdf' },
    async ({ user, params, query, res }) => { sendFile(res, await reportPdfFor(deps, user, params.id, query.unit)); });

  api.route({ method: 'get', path: '/surveys/:id/compliance/zones.csv', access: 'surveys.read', tag: 'reports', summary: 'The zone table as CSV (formula cells neutralised)', params: idParamsSchema, produces: 'text/csv' },
    ({ user, params, res }) => { sendFile(res, zonesCsv(deps.db, user, params.id)); });

  api.route({ method: 'get', path: '/surveys/:id/compliance/readings.csv', access: 'surveys.read', tag: 'reports', summary: 'The readings the verdicts used, with their zones, as CSV (unit=lx|fc)', params: idParamsSchema, query: reportQuerySchema, produces: 'text/csv' },
    ({ user, params, query, res }) => { sendFile(res, readingsCsv(deps.db, user, params.id, query.unit)); });

  api.route({ method: 'post', path: '/surveys/:id/report/send', access: 'reports.send', tag: 'reports', summary: 'E-mail the PDF report to chosen recipients (queued: the PDF is built and sent in the background)', params: idParamsSchema, body: sendReportBodySchema, status: 202, response: sendReportResponseSchema },
    ({ user, params, body }) => sendReport(deps, user, params.id, body));
}
