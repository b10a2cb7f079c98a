import { z } from 'zod';
import { multiLineText, singleLineText } from './text';
import { isoDateTimeSchema } from './common';

export const COEFFICIENT_SET_STATUSES = ['draft', 'approved'] as const;
/** A calibration reminder's reason: due within the warning window, or past due. Stored codes. */
export const CALIBRATION_REMINDER_KINDS = ['due_soon', 'overdue'] as const;

export const gainCoefficientsSchema = z.object({
  code: z.number().int().min(0).max(65535),
  darkCounts: z.number().finite('Dark counts must be a number').min(-1e9).max(1e9),
  luxPerCount: z.number().positive('Lux per count must be positive').max(1e9),
  /** Relative standard uncertainty (k = 1), e.g. 0.012 for 1.2 %. */
  uRel: z.number().min(0, 'uRel cannot be negative').max(1, 'uRel is a fraction (0.012 = 1.2 %)'),
  uDarkCounts: z.number().min(0).max(1e9).optional(),
});
export type GainCoefficientsInput = z.infer<typeof gainCoefficientsSchema>;

const draftCommon = {
  effectiveFrom: isoDateTimeSchema,
  dueDate: isoDateTimeSchema,
  certificateNumber: singleLineText(z.string().trim().min(1, 'Enter the certificate number').max(80)),
  note: multiLineText(z.string().trim().max(1000)).default(''),
};

function dueAfterEffective(v: { effectiveFrom: string; dueDate: string }, ctx: z.RefinementCtx) {
  if (Date.parse(v.dueDate) <= Date.parse(v.effectiveFrom)) ctx.addIssue({ code: 'custom', path: ['dueDate'], message: 'The due date must be after the effective-from time' });
}

/** A draft typed in (e.g. from a paper certificate). */
export const manualDraftSchema = z.object({
  source: z.literal('manual'),
  ...draftCommon,
  tRefMs: z.number().positive('The reference integration time must be positive').max(1e7),
  alphaPerK: z.number().min(-0.1).max(0.1),
  tCalC: z.number().min(-50).max(100),
  gains: z.array(gainCoefficientsSchema).min(1, 'Give coefficients for at least one gain code').max(16),
});

/** A draft from a bench run's fit: tRef, alpha, Tcal and the per-code coefficients come from the run. */
export const benchRunDraftSchema = z.object({
  source: z.literal('bench_run'),
  ...draftCommon,
  benchRunId: z.number().int().positive(),
});

export const createCoefficientSetBodySchema = z.discriminatedUnion('source', [manualDraftSchema, benchRunDraftSchema]).superRefine(dueAfterEffective);
export type CreateCoefficientSetBody = z.input<typeof createCoefficientSetBodySchema>;

export const personSchema = z.object({ id: z.number().int(), name: z.string(), email: z.string() });

export const coefficientSetSchema = z.object({
  id: z.number().int(),
  probeId: z.number().int(),
  version: z.number().int(),
  status: z.enum(COEFFICIENT_SET_STATUSES),
  effectiveFrom: z.string(),
  dueDate: z.string(),
  tRefMs: z.number(),
  alphaPerK: z.number(),
  tCalC: z.number(),
  gains: z.array(gainCoefficientsSchema),
  certificateNumber: z.string(),
  certificate: z.object({ filename: z.string(), size: z.number().int(), sha256: z.string() }).nullable(),
  benchRunId: z.number().int().nullable(),
  note: z.string(),
  draftedBy: personSchema.nullable(),
  approvedBy: personSchema.nullable(),
  approvedAt: z.string().nullable(),
  /** True for the approved set in force now. */
  inForce: z.boolean(),
  createdAt: z.string(),
});
export type CoefficientSetDto = z.infer<typeof coefficientSetSchema>;
export const coefficientSetListResponseSchema = z.object({ items: z.array(coefficientSetSchema) });

/** Largest certificate PDF accepted. */
export const CERTIFICATE_MAX_BYTES = 10 * 1024 * 1024;

export const reminderRunResponseSchema = z.object({
  messagesSent: z.number().int(),
  reminded: z.array(z.object({ probeId: z.number().int(), serial: z.string(), kind: z.enum(CALIBRATION_REMINDER_KINDS), dueDate: z.string() })),
  skippedRecentlyReminded: z.array(z.string()),
});
export type ReminderRunResponse = z.infer<typeof reminderRunResponseSchema>;
