import { z } from 'zod';
import { CONTEXT_MODIFIER_IDS } from '../core/illuminance-scale';
import { multiLineText, singleLineText } from './text';

export const TARGET_CONFIDENCE = ['published', 'secondary', 'memory'] as const;
export type TargetConfidence = (typeof TARGET_CONFIDENCE)[number];

export const CONFIDENCE_LABELS: Record<TargetConfidence, string> = {
  published: 'Published table',
  secondary: 'Secondary source',
  memory: 'From memory (unchecked)',
};

export const SOURCE_UNITS = ['lx', 'fc'] as const;

/** A use type names what a zone is used for, e.g. `office_writing`; zones name it, targets define it. */
export const useTypeSchema = z.string().trim().min(2, 'Use at least 2 characters').max(60)
  .regex(/^[a-z0-9_]+$/, 'Use lower-case letters, digits and underscores, e.g. office_writing');

export const targetSchema = z.object({
  id: z.number().int(),
  useType: z.string(),
  name: z.string(),
  /** Maintained illuminance Em, always lux. */
  emLux: z.number(),
  /** The unit the source states Em in, and Em in that unit (e.g. 30 fc). */
  sourceUnit: z.enum(SOURCE_UNITS),
  emSourceValue: z.number(),
  u0Min: z.number().nullable(),
  /** EN 12464-1:2021: `emLux` is the required maintained value; the modified one is the most context modifiers lead to. Lux; null where not given. */
  emModifiedLux: z.number().nullable(),
  /** Cylindrical illuminance Ez, lux. */
  ezLux: z.number().nullable(),
  /** Wall and ceiling maintained illuminances, lux, each with U0 ≥ surfaceU0Min. */
  emWallLux: z.number().nullable(),
  emCeilingLux: z.number().nullable(),
  surfaceU0Min: z.number(),
  /** Colour rendering index and unified glare rating limit: for information, a meter cannot measure them. */
  ra: z.number().nullable(),
  rugl: z.number().nullable(),
  dfTargetPercent: z.number().optional(),
  source: z.string(),
  confidence: z.enum(TARGET_CONFIDENCE),
  /** Shipped with Luxtrail (read-only) rather than the organisation's own entry. */
  shipped: z.boolean(),
});
export type TargetEntry = z.infer<typeof targetSchema>;

export const targetListResponseSchema = z.object({ items: z.array(targetSchema) });
export type TargetListResponse = z.infer<typeof targetListResponseSchema>;

const u0Schema = z.number().min(0, 'U0 is between 0 and 1').max(1, 'U0 is between 0 and 1');
const dfSchema = z.number().positive('The daylight factor target must be above 0 %').max(100, 'A daylight factor is at most 100 %');

const luxSchema = (what: string) => z.number({ message: `Enter ${what} as a number of lux` }).positive(`${what} must be above 0 lx`).max(200_000, `${what} above 200,000 lx is not an illuminance target`);

/** Words shown beside Ra and RUGL wherever an entry is shown. */
export const INFO_ONLY_NOTE = 'Ra and RUGL are shown for information: an illuminance meter cannot measure colour rendering or glare, so they are not judged.';

const fields = {
  useType: useTypeSchema,
  name: singleLineText(z.string().trim().min(1, 'Give the entry a name').max(160)),
  /** Em in the source unit; the server stores lux. */
  emValue: z.number({ message: 'Enter Em as a number' }).positive('Em must be above 0').max(200_000, 'Em above 200,000 lx is not an illuminance target'),
  sourceUnit: z.enum(SOURCE_UNITS).default('lx'),
  u0Min: u0Schema.nullable().default(null),
  dfTargetPercent: dfSchema.nullable().default(null),
  emModifiedLux: luxSchema('The modified value').nullable().default(null),
  ezLux: luxSchema('Ez').nullable().default(null),
  emWallLux: luxSchema('The wall illuminance').nullable().default(null),
  emCeilingLux: luxSchema('The ceiling illuminance').nullable().default(null),
  ra: z.number().int('Ra is a whole number').min(0, 'Ra is between 0 and 100').max(100, 'Ra is between 0 and 100').nullable().default(null),
  rugl: z.number().int('RUGL is a whole number').min(5, 'RUGL is between 5 and 40').max(40, 'RUGL is between 5 and 40').nullable().default(null),
  source: singleLineText(z.string().trim().min(3, 'Say where the value comes from, e.g. the client\'s specification and clause').max(300)),
  confidence: z.enum(TARGET_CONFIDENCE).default('published'),
};

const modifiedNotBelowRequired = (b: { emValue?: number; sourceUnit?: string; emModifiedLux?: number | null }) =>
  b.emModifiedLux == null || b.emValue === undefined || b.sourceUnit === 'fc' || b.emModifiedLux >= b.emValue;
const modifiedMessage = { message: 'The modified value cannot be below the required value Em', path: ['emModifiedLux'] };

/** The fields without the cross-field check, for forms that extend them (zod cannot extend a refined object). */
export const targetFieldsSchema = z.object(fields);
export const TARGET_MODIFIED_CHECK = [modifiedNotBelowRequired, modifiedMessage] as const;
export const createTargetBodySchema = targetFieldsSchema.refine(...TARGET_MODIFIED_CHECK);
export type CreateTargetBody = z.infer<typeof createTargetBodySchema>;

export const updateTargetBodySchema = z.object({
  useType: fields.useType.optional(),
  name: fields.name.optional(),
  emValue: fields.emValue.optional(),
  sourceUnit: z.enum(SOURCE_UNITS).optional(),
  u0Min: u0Schema.nullable().optional(),
  dfTargetPercent: dfSchema.nullable().optional(),
  emModifiedLux: fields.emModifiedLux.optional(),
  ezLux: fields.ezLux.optional(),
  emWallLux: fields.emWallLux.optional(),
  emCeilingLux: fields.emCeilingLux.optional(),
  ra: fields.ra.optional(),
  rugl: fields.rugl.optional(),
  source: fields.source.optional(),
  confidence: z.enum(TARGET_CONFIDENCE).optional(),
}).refine(modifiedNotBelowRequired, modifiedMessage).refine((b) => Object.keys(b).length > 0, { message: 'Change at least one field' });
export type UpdateTargetBody = z.infer<typeof updateTargetBodySchema>;

export const zoneTargetParamsSchema = z.object({ zoneId: z.coerce.number().int().positive() });
/**
 * Picks a specific library entry for a zone (null: the entry named by the zone's use type) and the
 * maintained value the design chose with the context modifiers that led to it (EN 12464-1:2021);
 * chosenEmLux null: the entry's required value.
 */
export const setZoneTargetBodySchema = z.object({
  targetId: z.number().int().positive().nullable(),
  chosenEmLux: z.number({ message: 'Enter the chosen value as a number of lux' }).positive('The chosen value must be above 0 lx').nullable().default(null),
  contextModifiers: z.array(z.enum(CONTEXT_MODIFIER_IDS, { message: `A context modifier is one of ${CONTEXT_MODIFIER_IDS.join(', ')}` })).max(CONTEXT_MODIFIER_IDS.length).default([])
    .refine((a) => new Set(a).size === a.length, 'Name each context modifier once'),
  contextNote: multiLineText(z.string().trim().max(1000)).nullable().default(null),
});
export type SetZoneTargetBody = z.infer<typeof setZoneTargetBodySchema>;
export type SetZoneTargetInput = z.input<typeof setZoneTargetBodySchema>;

export const designValueSchema = z.object({
  emLux: z.number(),
  basis: z.enum(['required', 'modified', 'stepped']),
  steps: z.number().int(),
  explanation: z.string(),
  problems: z.array(z.string()),
});
export type DesignValueInfo = z.infer<typeof designValueSchema>;

export const zoneTargetResponseSchema = z.object({
  zoneId: z.number().int(), useType: z.string(), targetId: z.number().int().nullable(), target: targetSchema.nullable(),
  chosenEmLux: z.number().nullable(),
  contextModifiers: z.array(z.string()),
  contextNote: z.string().nullable(),
  /** The value the zone is judged against and why; null without a target. */
  design: designValueSchema.nullable(),
});
export type ZoneTargetResponse = z.infer<typeof zoneTargetResponseSchema>;
