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
