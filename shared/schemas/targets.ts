import { z } from 'zod';

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

const fields = {
  useType: useTypeSchema,
  name: z.string().trim().min(1, 'Give the entry a name').max(160),
  /** Em in the source unit; the server stores lux. */
  emValue: z.number({ message: 'Enter Em as a number' }).positive('Em must be above 0').max(200_000, 'Em above 200,000 lx is not an illuminance target'),
  sourceUnit: z.enum(SOURCE_UNITS).default('lx'),
  u0Min: u0Schema.nullable().default(null),
  dfTargetPercent: dfSchema.nullable().default(null),
  source: z.string().trim().min(3, 'Say where the value comes from, e.g. the client\'s specification and clause').max(300),
  confidence: z.enum(TARGET_CONFIDENCE).default('published'),
};

export const createTargetBodySchema = z.object(fields);
export type CreateTargetBody = z.infer<typeof createTargetBodySchema>;

export const updateTargetBodySchema = z.object({
  useType: fields.useType.optional(),
  name: fields.name.optional(),
  emValue: fields.emValue.optional(),
  sourceUnit: z.enum(SOURCE_UNITS).optional(),
  u0Min: u0Schema.nullable().optional(),
  dfTargetPercent: dfSchema.nullable().optional(),
  source: fields.source.optional(),
  confidence: z.enum(TARGET_CONFIDENCE).optional(),
}).refine((b) => Object.keys(b).length > 0, { message: 'Change at least one field' });
export type UpdateTargetBody = z.infer<typeof updateTargetBodySchema>;

export const zoneTargetParamsSchema = z.object({ zoneId: z.coerce.number().int().positive() });
/** Picks a specific library entry for a zone; null goes back to the entry named by the zone's use type. */
export const setZoneTargetBodySchema = z.object({ targetId: z.number().int().positive().nullable() });
export type SetZoneTargetBody = z.infer<typeof setZoneTargetBodySchema>;
export const zoneTargetResponseSchema = z.object({ zoneId: z.number().int(), useType: z.string(), targetId: z.number().int().nullable(), target: targetSchema.nullable() });
export type ZoneTargetResponse = z.infer<typeof zoneTargetResponseSchema>;
