import { z } from 'zod';
import { IMPORT_STATUSES } from './imports';
import { GRID_ROUNDINGS } from '../spatial/measurement-grid';
import { multiLineText, singleLineText } from './text';

export const SURVEY_STATUSES = ['draft', 'submitted', 'signed_off', 'returned'] as const;
/** A survey of an installation in service, or a new one (judged against maintained values via MF). Stored codes. */
export const INSTALLATION_STATES = ['in_service', 'new'] as const;
export type SurveyStatus = (typeof SURVEY_STATUSES)[number];

/** What a person may do with a survey now; decided by shared/survey-abilities.ts, carried in survey answers. */
export const SURVEY_ABILITIES = ['edit', 'setInstallation', 'upload', 'submit', 'signOff', 'return', 'redecode'] as const;
export type SurveyAbility = (typeof SURVEY_ABILITIES)[number];
export const surveyAbilitiesSchema = z.object(Object.fromEntries(SURVEY_ABILITIES.map((a) => [a, z.boolean()])) as Record<SurveyAbility, z.ZodBoolean>);
export type SurveyAbilities = Record<SurveyAbility, boolean>;

export const SURVEY_STATUS_LABELS: Record<SurveyStatus, string> = {
  draft: 'Draft',
  submitted: 'Submitted',
  signed_off: 'Signed off',
  returned: 'Returned for changes',
};

export const surveyConditionsSchema = z.object({
  /** True when daylight was excluded (blinds down, after dark) so readings are electric light only. */
  daylightExcluded: z.boolean(),
  /** Judge points that have a lights-on/off pair on the electric light alone, E_on - E_off (ASR A3.4 section 7.3). */
  pairedDaylight: z.boolean().optional(),
  notes: multiLineText(z.string().trim().max(1000)).optional(),
});
export type SurveyConditions = z.infer<typeof surveyConditionsSchema>;

const factorPart = (name: string) => z.number({ message: `Enter ${name} as a number` }).gt(0, `${name} must be above 0`).max(1, `${name} is at most 1`);

/** Maintenance factor parts (CIE 97:2005): MF = LLMF × LSF × LMF × RSMF. */
export const mfPartsSchema = z.object({ llmf: factorPart('LLMF'), lsf: factorPart('LSF'), lmf: factorPart('LMF'), rsmf: factorPart('RSMF') });

/**
 * New installation (judged against Em / MF) or in service (against Em). A new one gives its design's
 * maintenance factor, or its parts, or both (then they must agree to 0.001).
 */
export const installationSchema = z.discriminatedUnion('state', [
  z.object({ state: z.literal('in_service') }),
  z.object({ state: z.literal('new'), maintenanceFactor: factorPart('The maintenance factor').optional(), parts: mfPartsSchema.optional() })
    .refine((i) => i.maintenanceFactor !== undefined || i.parts !== undefined, { message: 'A new installation needs its maintenance factor or its parts (LLMF, LSF, LMF, RSMF)', path: ['maintenanceFactor'] })
    .refine((i) => i.maintenanceFactor === undefined || i.parts === undefined || Math.abs(i.parts.llmf * i.parts.lsf * i.parts.lmf * i.parts.rsmf - i.maintenanceFactor) <= 0.001,
      { message: 'The maintenance factor differs from LLMF × LSF × LMF × RSMF', path: ['maintenanceFactor'] }),
]);
export type InstallationInput = z.infer<typeof installationSchema>;

/** As stored and answered: the factor is always given for a new installation. */
export const installationInfoSchema = z.object({
  state: z.enum(INSTALLATION_STATES),
  maintenanceFactor: z.number().nullable(),
  parts: mfPartsSchema.nullable(),
});
export type InstallationInfo = z.infer<typeof installationInfoSchema>;

export const createSurveyBodySchema = z.object({
  siteId: z.number().int().positive(),
  name: singleLineText(z.string().trim().min(1, 'Enter a survey name').max(160)),
  startedOn: z.iso.date({ message: 'Use a date such as 2026-11-20' }).optional(),
  conditions: surveyConditionsSchema.optional(),
  installation: installationSchema.optional(),
  /** Grid rounding to plan and judge with; the organisation's default when absent. */
  gridRounding: z.enum(GRID_ROUNDINGS).optional(),
});
export type CreateSurveyBody = z.input<typeof createSurveyBodySchema>;

export const surveyListQuerySchema = z.object({
  siteId: z.coerce.number().int().positive().optional(),
  status: z.enum(SURVEY_STATUSES).optional(),
});

export const surveySchema = z.object({
  id: z.number().int(),
  siteId: z.number().int(),
  siteName: z.string(),
  siteTimeZone: z.string(),
  name: z.string(),
  startedOn: z.string().nullable(),
  conditions: surveyConditionsSchema.nullable(),
  installation: installationInfoSchema,
  status: z.enum(SURVEY_STATUSES),
  activeDecodeId: z.number().int().nullable(),
  readingCount: z.number().int(),
  /** The grid rounding the survey is planned and judged with. */
  gridRounding: z.enum(GRID_ROUNDINGS),
  createdAt: z.string(),
});
export type Survey = z.infer<typeof surveySchema>;

export const surveyListResponseSchema = z.object({ items: z.array(surveySchema) });
export type SurveyListResponse = z.infer<typeof surveyListResponseSchema>;

export const decodeSummarySchema = z.object({
  id: z.number().int(),
  reason: z.string(),
  createdAt: z.string(),
  createdByName: z.string().nullable(),
  active: z.boolean(),
});

export const surveyImportSummarySchema = z.object({
  id: z.number().int(),
  filename: z.string(),
  status: z.enum(IMPORT_STATUSES),
  rowsRead: z.number().int(),
  readings: z.number().int(),
  errorCount: z.number().int(),
  createdAt: z.string(),
});

/** One survey with what its page needs at the top: counts per flag, imports and decodes. */
export const surveyDetailSchema = surveySchema.extend({
  flagCounts: z.record(z.string(), z.number().int()),
  /** Readings decoded with a coefficient set whose due date had passed. */
  calibrationLapsedCount: z.number().int(),
  /** What the caller may do with this survey now (shared/survey-abilities.ts). */
  abilities: surveyAbilitiesSchema,
  imports: z.array(surveyImportSummarySchema),
  decodes: z.array(decodeSummarySchema),
});
export type SurveyDetail = z.infer<typeof surveyDetailSchema>;
