import { sqliteTable, integer, text, blob, primaryKey, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { decodes, logImports, surveys } from './surveys';

/**
 * Readings per (decode, import), kept when an import is accepted or a survey re-decoded, so lists
 * count a survey's current readings without scanning them (server/modules/surveys/reading-counts.ts).
 */
export const readingCounts = sqliteTable('reading_counts', {
  decodeId: integer('decode_id').notNull().references(() => decodes.id),
  importId: integer('import_id').notNull().references(() => logImports.id),
  readings: integer('readings').notNull(),
}, (t) => [primaryKey({ columns: [t.decodeId, t.importId] })]);

/**
 * A survey's judged zones for one set of inputs (decode, accepted imports, zones, targets, rule,
 * conditions), named by `inputsKey`, a hash of them (server/modules/compliance/verdict-aggregates.ts).
 * A live aggregate is replaced when its inputs change; one a sign-off froze is kept for good.
 */
export const verdictAggregates = sqliteTable('verdict_aggregates', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  inputsKey: text('inputs_key').notNull(),
  frozen: integer('frozen', { mode: 'boolean' }).notNull().default(false),
  /** The judged zones without their reading lists, warnings, counts (AggregateSummary). */
  summary: text('summary', { mode: 'json' }).notNull(),
  createdAt: integer('created_at').notNull(),
}, (t) => [uniqueIndex('verdict_aggregates_key_idx').on(t.surveyId, t.inputsKey)]);

/** Which readings each judged zone used: reading ids as Float64Arrays, daylight factors as (id, %) pairs. */
export const verdictAggregateZones = sqliteTable('verdict_aggregate_zones', {
  aggregateId: integer('aggregate_id').notNull().references(() => verdictAggregates.id, { onDelete: 'cascade' }),
  zoneId: integer('zone_id').notNull(),
  readingIds: blob('reading_ids', { mode: 'buffer' }).notNull(),
  wallBandReadingIds: blob('wall_band_reading_ids', { mode: 'buffer' }).notNull(),
  otherPlaneReadingIds: blob('other_plane_reading_ids', { mode: 'buffer' }).notNull(),
  pointDf: blob('point_df', { mode: 'buffer' }).notNull(),
}, (t) => [primaryKey({ columns: [t.aggregateId, t.zoneId] })]);

/**
 * The large parts of an aggregate's answers, built once (answer-parts.ts) and kept beside it: a
 * zone's points (`zone:<zone id>`, extra: its point labels) and a plan's drawn readings
 * (`map:<plan id>`, extra: the probes they name). `deflated` is the packed JSON of
 * server/http/packed-json.ts, with its CRC-32 and uncompressed length. Kept in the database, not
 * in the process: 40 zones of a 500,000-reading survey are about 9 MB, and they outlive a restart.
 */
export const verdictAnswerParts = sqliteTable('verdict_answer_parts', {
  aggregateId: integer('aggregate_id').notNull().references(() => verdictAggregates.id, { onDelete: 'cascade' }),
  part: text('part').notNull(),
  deflated: blob('deflated', { mode: 'buffer' }).notNull(),
  crc: integer('crc').notNull(),
  length: integer('length').notNull(),
  extra: text('extra').notNull(),
}, (t) => [primaryKey({ columns: [t.aggregateId, t.part] })]);
