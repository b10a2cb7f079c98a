import { z } from 'zod';

/** The bench CSV's columns, in any order; temp_c may be empty. */
export const BENCH_COLUMNS = ['gain', 'reference_lux', 'counts', 'int_ms', 'temp_c'] as const;
export const BENCH_REQUIRED_COLUMNS = ['gain', 'reference_lux', 'counts', 'int_ms'] as const;
export const BENCH_MAX_ROWS = 20_000;
export const BENCH_MAX_BYTES = 5 * 1024 * 1024;

/** Multipart text fields beside the `file`: how to fit (strings, as a form sends them). */
export const benchRunFieldsSchema = z.object({
  tRefMs: z.coerce.number().positive('tRefMs must be a positive number of ms').max(1e7).default(100),
  /** The reference meter's relative standard uncertainty (k = 1): its certificate value divided by its k. */
  referenceURel: z.coerce.number().min(0).max(0.5, 'referenceURel is a fraction (0.01 = 1 %)').default(0.01),
  alphaPerK: z.coerce.number().min(-0.1).max(0.1).default(0),
  tCalC: z.coerce.number().min(-50).max(100).default(23),
});
export type BenchRunFields = z.infer<typeof benchRunFieldsSchema>;

/** A row-level problem in an uploaded bench file. */
export const benchRowErrorSchema = z.object({
  /** null for a problem of the whole data (e.g. the core could not fit a gain code). */
  line: z.number().int().nullable(),
  column: z.string().nullable(),
  value: z.string().nullable(),
  message: z.string(),
});
export type BenchRowError = z.infer<typeof benchRowErrorSchema>;

export const benchRowSchema = z.object({
  line: z.number().int(),
  gain: z.number().int(),
  referenceLux: z.number(),
  counts: z.number(),
  intMs: z.number(),
  tempC: z.number().nullable(),
});
export type BenchRowDto = z.infer<typeof benchRowSchema>;

export const gainFitSchema = z.object({
  code: z.number().int(),
  nominalGain: z.number().nullable(),
  n: z.number().int(),
  responsivity: z.number(),
  luxPerCount: z.number(),
  uLuxPerCount: z.number(),
  darkCounts: z.number(),
  uDarkCounts: z.number(),
  correlation: z.number().nullable(),
  residualSdCounts: z.number(),
  rSquared: z.number(),
  linearity: z.number(),
  suggestedURel: z.number(),
  ratio: z.object({ neighbourCode: z.number().int(), measured: z.number(), nominal: z.number(), deviation: z.number(), mismatch: z.boolean() }).nullable(),
  /** Per row of this code, in file order: reference lux, counts, the fitted counts and the residual (counts - fitted). */
  points: z.array(z.object({ line: z.number().int(), referenceLux: z.number(), counts: z.number(), fitted: z.number(), residual: z.number() })),
});
export type GainFitDto = z.infer<typeof gainFitSchema>;

export const benchRunSchema = z.object({
  id: z.number().int(),
  probeId: z.number().int(),
  filename: z.string(),
  sha256: z.string(),
  rowCount: z.number().int(),
  options: z.object({ tRefMs: z.number(), referenceURel: z.number(), alphaPerK: z.number(), tCalC: z.number() }),
  gains: z.array(gainFitSchema),
  issues: z.array(z.string()),
  /** Largest linearity figure the fit table flags (LINEARITY_FLAG_LIMIT). */
  linearityLimit: z.number(),
  createdBy: z.string().nullable(),
  createdAt: z.string(),
});
export type BenchRunDto = z.infer<typeof benchRunSchema>;
export const benchRunDetailSchema = benchRunSchema.extend({ rows: z.array(benchRowSchema) });
export type BenchRunDetailDto = z.infer<typeof benchRunDetailSchema>;
export const benchRunListResponseSchema = z.object({ items: z.array(benchRunSchema) });

/** A largest relative residual above this is flagged on the fit table (project's own choice, common practice for a working-standard probe; not from a standard). */
export const LINEARITY_FLAG_LIMIT = 0.01;
