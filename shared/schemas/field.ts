import { z } from 'zod';
import { isoDateTimeSchema } from './common';
import { multiLineText, singleLineText } from './text';
import { SKY_STATES } from '../core/field-conditions';
import { planSchema } from './plans';

/** A client-made key (a UUID from the phone): the same key twice stores one record. */
export const idempotencyKeySchema = z.string().trim().min(8, 'The idempotency key is at least 8 characters').max(80).regex(/^[A-Za-z0-9_-]+$/, 'Use letters, digits, - and _ only');

/** Most values one point takes in one typed record (project's own choice). */
export const MAX_TYPED_VALUES = 20;

export const BLINDS_STATES = ['open', 'closed', 'none'] as const;
export const FIELD_UNITS = ['lx', 'fc'] as const;
/** What a field record is: typed values, a mark for a logger burst, a skipped point, or a note on a zone. Stored codes. */
export const FIELD_RECORD_KINDS = ['typed', 'mark', 'skip', 'zone_note'] as const;
/** The electric lighting when a typed value was taken (lights-on/off pairs). Stored codes. */
export const LIGHTS_STATES = ['on', 'off'] as const;

export const fieldSessionBodySchema = z.object({
  idempotencyKey: idempotencyKeySchema,
  measuredBy: singleLineText(z.string().trim().min(1, 'Say who measured').max(160)),
  startedAt: isoDateTimeSchema,
  lightsOnAt: isoDateTimeSchema.nullable().optional(),
  supplyVoltageV: z.number().finite().min(0).max(1000).nullable().optional(),
  ambientTempC: z.number().finite().min(-50).max(70).nullable().optional(),
  sky: z.enum(SKY_STATES).nullable().optional(),
  blinds: z.enum(BLINDS_STATES).nullable().optional(),
  lampBurnInHours: z.number().finite().min(0).max(1e6).nullable().optional(),
  daylightExcluded: z.boolean(),
  note: multiLineText(z.string().trim().max(1000)).optional(),
});
export type FieldSessionBody = z.input<typeof fieldSessionBodySchema>;

/** Where a record was taken: a label and, when known, the planned point or the plan position. */
const placeFields = {
  point: singleLineText(z.string().trim().min(1, 'Name the point').max(120)),
  plannedPointId: z.number().int().positive().nullable().optional(),
  planId: z.number().int().positive().nullable().optional(),
  xM: z.number().finite().nullable().optional(),
  yM: z.number().finite().nullable().optional(),
  sessionKey: idempotencyKeySchema.nullable().optional(),
  recordedAt: isoDateTimeSchema,
  note: multiLineText(z.string().trim().max(1000)).optional(),
};

export const fieldRecordBodySchema = z.discriminatedUnion('kind', [
  z.object({
    idempotencyKey: idempotencyKeySchema, kind: z.literal('typed'), ...placeFields,
    probeId: z.number().int().positive(),
    // Bad values are named by the core with the meter's range (422); the schema only bounds the count.
    values: z.array(z.number()).min(1, 'Type at least one value').max(MAX_TYPED_VALUES, `At most ${MAX_TYPED_VALUES} values at one point`),
    unit: z.enum(FIELD_UNITS),
    lights: z.enum(LIGHTS_STATES).nullable().optional(),
  }),
  z.object({ idempotencyKey: idempotencyKeySchema, kind: z.literal('mark'), ...placeFields, probeId: z.number().int().positive().nullable().optional() }),
  z.object({ idempotencyKey: idempotencyKeySchema, kind: z.literal('skip'), ...placeFields, reason: singleLineText(z.string().trim().min(1, 'Say why the point was skipped').max(500)) }),
  // A written note on a whole zone (what no single point shows: a failed luminaire, glare, a blocked window).
  z.object({
    idempotencyKey: idempotencyKeySchema, kind: z.literal('zone_note'), zoneId: z.number().int().positive(),
    note: multiLineText(z.string().trim().min(1, 'Write the note').max(1000)), sessionKey: placeFields.sessionKey, recordedAt: isoDateTimeSchema,
  }),
]).superRefine((v, ctx) => {
  if (v.kind === 'zone_note') return;
  if ((v.xM == null) !== (v.yM == null)) ctx.addIssue({ code: 'custom', path: ['yM'], message: 'Give both xM and yM, or neither' });
  if (v.xM != null && v.planId == null && v.plannedPointId == null) ctx.addIssue({ code: 'custom', path: ['planId'], message: 'A position needs its plan' });
});
export type FieldRecordBody = z.input<typeof fieldRecordBodySchema>;

export const fieldWarningSchema = z.object({ code: z.string(), message: z.string() });

export const fieldRecordSchema = z.object({
  id: z.number().int(),
  idempotencyKey: z.string(),
  kind: z.enum(FIELD_RECORD_KINDS),
  sessionId: z.number().int().nullable(),
  /** The point's label; for a zone note, the zone's name when it was written. */
  point: z.string(),
  /** The zone a zone note is about; null for point records. */
  zoneId: z.number().int().nullable(),
  plannedPointId: z.number().int().nullable(),
  planId: z.number().int().nullable(),
  xM: z.number().nullable(),
  yM: z.number().nullable(),
  probeId: z.number().int().nullable(),
  probeSerial: z.string().nullable(),
  values: z.array(z.number()).nullable(),
  unit: z.enum(FIELD_UNITS).nullable(),
  lights: z.enum(LIGHTS_STATES).nullable(),
  reason: z.string().nullable(),
  note: z.string().nullable(),
  recordedAt: z.string(),
  /** Typed: the reading it made (lux, k = 2 uncertainty); null for marks and skips, and for a lights-off half. */
  reading: z.object({ id: z.number().int(), lux: z.number(), uLux: z.number(), n: z.number().int(), paired: z.boolean() }).nullable(),
  warnings: z.array(fieldWarningSchema),
});
export type FieldRecord = z.infer<typeof fieldRecordSchema>;

/** 201 when stored now, 200 when the key was already stored (the same record comes back). */
/** A zone note as the zone's verdict page shows it. */
export const zoneNoteSchema = z.object({ id: z.number().int(), note: z.string(), recordedAt: z.string() });
export type ZoneNote = z.infer<typeof zoneNoteSchema>;

export const fieldRecordResponseSchema = z.object({ record: fieldRecordSchema, alreadyStored: z.boolean() });

export const fieldSessionSchema = z.object({
  id: z.number().int(),
  idempotencyKey: z.string(),
  measuredBy: z.string(),
  startedAt: z.string(),
  lightsOnAt: z.string().nullable(),
  supplyVoltageV: z.number().nullable(),
  ambientTempC: z.number().nullable(),
  sky: z.enum(SKY_STATES).nullable(),
  blinds: z.enum(BLINDS_STATES).nullable(),
  lampBurnInHours: z.number().nullable(),
  daylightExcluded: z.boolean(),
  note: z.string().nullable(),
});
export type FieldSession = z.infer<typeof fieldSessionSchema>;
export const fieldSessionResponseSchema = z.object({ session: fieldSessionSchema, alreadyStored: z.boolean() });

export const fieldPhotoSchema = z.object({
  id: z.number().int(),
  idempotencyKey: z.string(),
  point: z.string().nullable(),
  plannedPointId: z.number().int().nullable(),
  zoneId: z.number().int().nullable(),
  note: z.string().nullable(),
  widthPx: z.number().int(),
  heightPx: z.number().int(),
  locationKept: z.boolean(),
  takenAt: z.string(),
  url: z.string(),
});
export type FieldPhoto = z.infer<typeof fieldPhotoSchema>;
export const fieldPhotoResponseSchema = z.object({ photo: fieldPhotoSchema, alreadyStored: z.boolean() });

/** Multipart fields beside `file`. */
export const fieldPhotoFieldsSchema = z.object({
  idempotencyKey: idempotencyKeySchema,
  point: singleLineText(z.string().trim().max(120)).optional(),
  plannedPointId: z.coerce.number().int().positive().optional(),
  zoneId: z.coerce.number().int().positive().optional(),
  note: multiLineText(z.string().trim().max(1000)).optional(),
  takenAt: isoDateTimeSchema,
  keepLocation: z.enum(['true', 'false']).default('false').transform((v) => v === 'true'),
});

export const fieldManualProbeSchema = z.object({
  id: z.number().int(),
  serial: z.string(),
  kind: z.string(),
  description: z.string(),
  meterClass: z.string().nullable(),
  rangeLowLux: z.number().nullable(),
  rangeHighLux: z.number().nullable(),
  /** Relative standard uncertainty of the set in force now (certificate), or null. */
  certificateURel: z.number().nullable(),
  calibrationState: z.string(),
});

/** Everything the field view needs for one survey, also what "take offline" keeps. */
export const fieldStateSchema = z.object({
  survey: z.object({ id: z.number().int(), name: z.string(), siteName: z.string(), siteTimeZone: z.string(), status: z.string(), daylightExcluded: z.boolean(), pairedDaylight: z.boolean(), acceptsRecords: z.boolean(), refusal: z.string().nullable() }),
  plans: z.array(planSchema),
  zones: z.array(z.object({ id: z.number().int(), planId: z.number().int(), name: z.string(), kind: z.string(), polygon: z.array(z.tuple([z.number(), z.number()])) })),
  plannedPoints: z.array(z.object({ id: z.number().int(), planId: z.number().int(), zoneId: z.number().int().nullable(), label: z.string(), xM: z.number(), yM: z.number() })),
  probes: z.array(fieldManualProbeSchema),
  sessions: z.array(fieldSessionSchema),
  records: z.array(fieldRecordSchema),
  photos: z.array(fieldPhotoSchema),
  warmUpMinutes: z.number(),
  maxPairGapS: z.number(),
});
export type FieldState = z.infer<typeof fieldStateSchema>;

/** Upload fields for placing a label-free log by time (beside the log's own `planId`). */
export const matchFieldsSchema = z.object({
  matchMarks: z.enum(['true', 'false']).optional().transform((v) => v === 'true'),
  matchWindowS: z.coerce.number().finite().min(0).max(600).optional(),
  clockOffsetS: z.coerce.number().finite().min(-86_400).max(86_400).optional(),
  /** Align one known mark instead of typing the offset: this mark and the log's burst at alignBurstAt. */
  alignMarkId: z.coerce.number().int().positive().optional(),
  alignBurstAt: isoDateTimeSchema.optional(),
});
