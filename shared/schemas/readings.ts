import { z } from 'zod';
import { LUX_BOUNDS, READING_FLAGS, READING_ROLES, type ReadingFlag } from '../core/types';
import { READING_PLANES } from '../core/planes';
import { singleLineText } from './text';

export const READING_FLAG_LABELS: Record<ReadingFlag, string> = {
  ok: 'OK',
  over_range: 'Over range',
  under_range: 'Under range',
  fault: 'Signal fault',
  calibration_lapsed: 'Calibration lapsed',
  low_confidence: 'Low confidence',
};

export const READING_SORTS = ['time', 'point', 'lux', 'flag', 'probe'] as const;

export const readingsQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(5000).default(100),
  offset: z.coerce.number().int().min(0).default(0),
  flag: z.enum(READING_FLAGS).optional(),
  /** Readings whose point label contains this text (case-insensitive). */
  point: singleLineText(z.string().trim().max(120)).optional(),
  sort: z.enum(READING_SORTS).default('time'),
  order: z.enum(['asc', 'desc']).default('asc'),
});
export type ReadingsQuery = z.input<typeof readingsQuerySchema>;

export const budgetPartSchema = z.object({ name: z.string(), uRel: z.number() });

export const readingSchema = z.object({
  id: z.number().int(),
  point: z.string(),
  xM: z.number().nullable(),
  yM: z.number().nullable(),
  /** The plan xM, yM refer to; null when the log did not say and the site has several plans. */
  planId: z.number().int().nullable(),
  role: z.enum(READING_ROLES),
  timestamp: z.string(),
  probe: z.string(),
  /** Lux; for over/under range the bound (see luxBound); null for a fault. */
  lux: z.number().nullable(),
  /** Expanded uncertainty U (k = 2), lux. */
  uLux: z.number().nullable(),
  luxBound: z.enum(LUX_BOUNDS),
  flag: z.enum(READING_FLAGS),
  gainCode: z.number().int().nullable(),
  samples: z.number().int(),
  /** Index (from 0) of the sample chosen within the burst. */
  chosenSample: z.number().int().nullable(),
  /** Relative standard uncertainties (k = 1) that make up uLux. */
  budget: z.array(budgetPartSchema),
  /** Where the sensor faced; azimuth (degrees clockwise from the plan's +y) for vertical and wall readings. */
  plane: z.enum(READING_PLANES),
  azimuthDeg: z.number().nullable(),
  /** Raw evidence behind the value or bound, as logged: counts (counting probes), mA or V (analog probes), integration time (ms), temperature (°C). */
  rawCounts: z.number().nullable(),
  rawSignal: z.number().nullable(),
  intMs: z.number().nullable(),
  tempC: z.number().nullable(),
  /** The coefficient set that decoded the reading. */
  coefficientSetId: z.number().int().nullable(),
});
export type Reading = z.infer<typeof readingSchema>;

export const readingsResponseSchema = z.object({ items: z.array(readingSchema), total: z.number().int() });
export type ReadingsResponse = z.infer<typeof readingsResponseSchema>;

/** The walk over time, thinned for a chart: every flagged reading is kept. */
export const readingSeriesSchema = z.object({
  items: z.array(z.object({ t: z.number(), lux: z.number().nullable(), gainCode: z.number().int().nullable(), flag: z.enum(READING_FLAGS), role: z.enum(READING_ROLES), point: z.string() })),
  total: z.number().int(),
});
export type ReadingSeries = z.infer<typeof readingSeriesSchema>;

export const readingsExportQuerySchema = z.object({ unit: z.enum(['lux', 'fc']).default('lux') });

export const redecodeResponseSchema = z.object({ decodeId: z.number().int(), previousDecodeId: z.number().int().nullable(), readings: z.number().int(), calibrationLapsed: z.number().int() });
export type RedecodeResponse = z.infer<typeof redecodeResponseSchema>;

/** A reading's decoded value as one decode gave it. */
export const decodedValueSchema = z.object({
  lux: z.number().nullable(),
  uLux: z.number().nullable(),
  luxBound: z.enum(LUX_BOUNDS),
  flag: z.enum(READING_FLAGS),
  coefficientSetId: z.number().int().nullable(),
  coefficientSetVersion: z.number().int().nullable(),
});
export type DecodedValue = z.infer<typeof decodedValueSchema>;

const decodeInfoSchema = z.object({ decodeId: z.number().int(), reason: z.string(), createdAt: z.string(), createdByName: z.string().nullable() });

/** What the latest re-decode changed, reading by reading (for calibration staff: read-only). */
export const decodeChangesSchema = z.object({
  surveyId: z.number().int(),
  surveyName: z.string(),
  siteName: z.string(),
  siteTimeZone: z.string(),
  status: z.enum(['draft', 'submitted', 'signed_off', 'returned']),
  /** True when a re-decode now would change nothing (every reading used the set in force at its time). */
  decodedWithCurrentSets: z.boolean(),
  /** The decode before the active one (null: never re-decoded). */
  before: decodeInfoSchema.nullable(),
  after: decodeInfoSchema.nullable(),
  /** Readings compared; changedTotal of them differ; at most DECODE_CHANGES_LIMIT are listed. */
  compared: z.number().int(),
  changedTotal: z.number().int(),
  changes: z.array(z.object({ readingId: z.number().int(), point: z.string(), timestamp: z.string(), probe: z.string(), before: decodedValueSchema, after: decodedValueSchema })),
});
export type DecodeChanges = z.infer<typeof decodeChangesSchema>;
