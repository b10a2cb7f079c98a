import { z } from 'zod';

export const IMPORT_STATUSES = ['queued', 'running', 'done', 'failed'] as const;

/**
 * How a stored block of samples is laid out (`sample_blocks.encoding`): 'f64' the slots before
 * readings had planes, 'f64p' with plane and azimuth (what imports write now), 'json' blocks
 * moved from the earlier one-row-per-sample table. Stored codes: a new layout gets a new code.
 */
export const SAMPLE_ENCODINGS = ['f64', 'f64p', 'json'] as const;
export type SampleEncoding = (typeof SAMPLE_ENCODINGS)[number];

/** One problem with a log file: where (line in the file, column) and what is wrong with which value. */
export const importProblemSchema = z.object({
  /** 1 is the header row; 0 means the file as a whole. */
  line: z.number().int(),
  column: z.string(),
  value: z.string(),
  message: z.string(),
});
export type ImportProblem = z.infer<typeof importProblemSchema>;

export const importWarningSchema = z.object({ line: z.number().int().nullable(), column: z.string().nullable(), message: z.string() });
export type ImportWarning = z.infer<typeof importWarningSchema>;

/** The multipart text fields of a log upload (the file goes in the field `file`). */
export const uploadLogFieldsSchema = z.object({
  /** The plan for rows whose `plan` column is empty; omitted or empty: the log's plan column decides. */
  planId: z.preprocess((v) => (v === '' || v === null ? undefined : v), z.coerce.number({ message: 'planId must be a plan id (a whole number)' }).int('planId must be a whole number').positive('planId must be a plan id').optional()),
  /** Placing bursts without a place on "measured here now" marks: the window either side of a mark, seconds. */
  matchWindowS: z.preprocess((v) => (v === '' || v === null ? undefined : v), z.coerce.number({ message: 'matchWindowS must be a number of seconds' }).finite().min(0, 'matchWindowS must be 0 s or more').max(600, 'matchWindowS must be at most 600 s').optional()),
  /** Added to the meter's clock to bring it onto the phone's, seconds (a meter 90 s slow: +90). */
  clockOffsetS: z.preprocess((v) => (v === '' || v === null ? undefined : v), z.coerce.number({ message: 'clockOffsetS must be a number of seconds' }).finite().min(-86_400, 'clockOffsetS must be within ±86400 s (one day)').max(86_400, 'clockOffsetS must be within ±86400 s (one day)').optional()),
});
export type UploadLogFields = z.infer<typeof uploadLogFieldsSchema>;

export const uploadLogResponseSchema = z.object({ importId: z.number().int() });

/** The outcome of placing an import's bursts by time on "measured here now" marks (shared/core/mark-matching.ts). */
export const markMatchingResultSchema = z.object({
  windowS: z.number(),
  clockOffsetS: z.number(),
  matched: z.array(z.object({
    importId: z.number().int(), readingId: z.number().int(), markId: z.number().int(), point: z.string(), probe: z.string(),
    burstAt: z.string(), markAt: z.string(), deltaS: z.number(), lux: z.number().nullable(),
  })),
  unplaced: z.array(z.object({
    readingId: z.number().int(), probe: z.string(), burstAt: z.string(), lux: z.number().nullable(),
    reason: z.enum(['no_mark', 'ambiguous', 'mark_taken']), message: z.string(), markPoints: z.array(z.string()),
  })),
  marksWithoutBurst: z.array(z.object({ markId: z.number().int(), point: z.string(), probe: z.string().nullable(), markAt: z.string() })),
});
export type MarkMatchingResult = z.infer<typeof markMatchingResultSchema>;

export const importStatusSchema = z.object({
  id: z.number().int(),
  surveyId: z.number().int(),
  filename: z.string(),
  /** The plan chosen at upload for rows that name none, or null. */
  planId: z.number().int().nullable(),
  status: z.enum(IMPORT_STATUSES),
  /** 0..1: the share of the file read so far. */
  progress: z.number().min(0).max(1),
  rowsRead: z.number().int(),
  readings: z.number().int(),
  /** How the readings got their place: the row's x_m, y_m; a planned point named by the row's point label; none (null for imports before this was counted, or not done). */
  placement: z.object({ byCoordinates: z.number().int(), byLabel: z.number().int(), none: z.number().int() }).nullable(),
  warnings: z.array(importWarningSchema),
  /** Up to 200 problems; a file with any is rejected whole. */
  errors: z.array(importProblemSchema),
  createdAt: z.string(),
  finishedAt: z.string().nullable(),
  /** How bursts without a place were placed by time on the survey's marks; null when the survey had no marks. */
  markMatching: markMatchingResultSchema.nullable(),
});
export type ImportStatus = z.infer<typeof importStatusSchema>;

