import { z } from 'zod';
import { multiLineText } from './text';
import { SURVEY_STATUSES } from './surveys';

export const submitSurveyBodySchema = z.object({
  note: multiLineText(z.string().trim().max(2000, 'Keep the note under 2,000 characters')).optional(),
});
export type SubmitSurveyBody = z.infer<typeof submitSurveyBodySchema>;

export const signOffBodySchema = z.object({
  comment: multiLineText(z.string().trim().max(2000, 'Keep the comment under 2,000 characters')).optional(),
});
export type SignOffBody = z.infer<typeof signOffBodySchema>;

export const returnSurveyBodySchema = z.object({
  comment: multiLineText(z.string().trim().min(3, 'Say what the surveyor should change (at least 3 characters)').max(2000, 'Keep the comment under 2,000 characters')),
});
export type ReturnSurveyBody = z.infer<typeof returnSurveyBodySchema>;

export const workflowStateSchema = z.object({
  surveyId: z.number().int(),
  status: z.enum(SURVEY_STATUSES),
  submittedAt: z.string().nullable(),
  submittedByName: z.string().nullable(),
  signedOffAt: z.string().nullable(),
  signedOffByName: z.string().nullable(),
  reviewComment: z.string().nullable(),
  /** Who was told by e-mail. */
  notified: z.array(z.string()),
});
export type WorkflowState = z.infer<typeof workflowStateSchema>;
