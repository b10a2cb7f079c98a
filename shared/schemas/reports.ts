import { z } from 'zod';
import { multiLineText } from './text';
import { emailSchema } from './common';

export const sendReportBodySchema = z.object({
  recipients: z.array(emailSchema, { message: 'Give the recipients as a list of e-mail addresses' })
    .min(1, 'Add at least one recipient').max(20, 'Send to at most 20 recipients at once'),
  message: multiLineText(z.string().trim().max(2000, 'Keep the message under 2,000 characters')).optional(),
});
export type SendReportBody = z.infer<typeof sendReportBodySchema>;

/** The report is queued: its PDF is built and mailed in the background (the Outbox shows when). */
export const sendReportResponseSchema = z.object({
  sentTo: z.array(z.string()),
  filename: z.string(),
  messageId: z.number().int(),
});
export type SendReportResponse = z.infer<typeof sendReportResponseSchema>;

export const reportUnitQuerySchema = z.object({ unit: z.enum(['lx', 'fc']).default('lx') });

/** A PDF being built off the request path: poll until done, then fetch the file. */
export const reportJobStateSchema = z.object({
  id: z.string(),
  surveyId: z.number().int(),
  status: z.enum(['running', 'done', 'failed']),
  /** 0 to 1. */
  progress: z.number().min(0).max(1),
  filename: z.string(),
  /** Bytes, once done. */
  size: z.number().int().nullable(),
  error: z.string().nullable(),
});
export type ReportJobState = z.infer<typeof reportJobStateSchema>;

export const reportJobParamsSchema = z.object({ jobId: z.string().uuid('Give the report job id as a UUID') });
export const reportJobBodySchema = z.object({ unit: z.enum(['lx', 'fc']).default('lx') });
