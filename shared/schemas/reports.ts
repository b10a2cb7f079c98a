import { z } from 'zod';
import { emailSchema } from './common';

export const sendReportBodySchema = z.object({
  recipients: z.array(emailSchema, { message: 'Give the recipients as a list of e-mail addresses' })
    .min(1, 'Add at least one recipient').max(20, 'Send to at most 20 recipients at once'),
  message: z.string().trim().max(2000, 'Keep the message under 2,000 characters').optional(),
});
export type SendReportBody = z.infer<typeof sendReportBodySchema>;

export const sendReportResponseSchema = z.object({
  sentTo: z.array(z.string()),
  filename: z.string(),
  size: z.number().int(),
});
export type SendReportResponse = z.infer<typeof sendReportResponseSchema>;
