import { sqliteTable, integer, text, real, blob, index, type AnySQLiteColumn } from 'drizzle-orm/sqlite-core';
import { sql } from 'drizzle-orm';
import { organizations, users, storedFiles } from './organizations';
import { probes } from './calibration';
import { plans } from './plans';
import { sites } from './sites';
import { INSTALLATION_STATES, SURVEY_STATUSES } from '@shared/schemas/surveys';
import { IMPORT_STATUSES, SAMPLE_ENCODINGS } from '@shared/schemas/imports';
import { LUX_BOUNDS, READING_FLAGS, READING_ROLES } from '@shared/core/types';
import { GRID_ROUNDINGS } from '@shared/core/zone-stats';
import { READING_PLANES } from '@shared/core/planes';

export type SurveyConditions = { daylightExcluded: boolean; pairedDaylight?: boolean; notes?: string };

/** The parts of a maintenance factor (CIE 97:2005), when the design states them. */
export type MaintenanceFactorParts = { llmf: number; lsf: number; lmf: number; rsmf: number };

export const surveys = sqliteTable('surveys', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  siteId: integer('site_id').notNull().references(() => sites.id),
  name: text('name').notNull(),
  startedOn: text('started_on'),
  conditions: text('conditions', { mode: 'json' }).$type<SurveyConditions>(),
  status: text('status', { enum: SURVEY_STATUSES }).notNull().default('draft'),
  /** A new installation is judged against Em / MF; one in service against Em. */
  installation: text('installation', { enum: INSTALLATION_STATES }).notNull().default('in_service'),
  maintenanceFactor: real('maintenance_factor'),
  mfParts: text('mf_parts', { mode: 'json' }).$type<MaintenanceFactorParts>(),
  /** The decode whose readings are current; earlier decodes stay recorded. */
  activeDecodeId: integer('active_decode_id'),
  reviewComment: text('review_comment'),
  submittedBy: integer('submitted_by').references(() => users.id),
  submittedAt: integer('submitted_at'),
  signedOffBy: integer('signed_off_by').references(() => users.id),
  signedOffAt: integer('signed_off_at'),
  /** What a sign-off was judged against: targets, rule, coefficient sets, verdicts. */
  frozen: text('frozen', { mode: 'json' }),
  /** The grid rounding this survey is planned and judged with (the organisation's default when created). */
  gridRounding: text('grid_rounding', { enum: GRID_ROUNDINGS }).notNull().default('next_higher'),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('surveys_site_idx').on(t.siteId), index('surveys_org_idx').on(t.organizationId)]);

export const logImports = sqliteTable('log_imports', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  fileId: integer('file_id').notNull().references(() => storedFiles.id),
  status: text('status', { enum: IMPORT_STATUSES }).notNull().default('queued'),
  progress: real('progress').notNull().default(0),
  rowsRead: integer('rows_read').notNull().default(0),
  readingCount: integer('reading_count').notNull().default(0),
  /** How the readings got their place (by the row's coordinates, by a planned point's label, none); null before it was counted. */
  placement: text('placement', { mode: 'json' }).$type<{ byCoordinates: number; byLabel: number; none: number }>(),
  warnings: text('warnings', { mode: 'json' }).$type<unknown[]>().notNull().default([]),
  errors: text('errors', { mode: 'json' }).$type<unknown[]>().notNull().default([]),
  /** The plan for rows whose `plan` column is empty (the upload's planId field); null: none given. */
  planId: integer('plan_id').references((): AnySQLiteColumn => plans.id),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
  finishedAt: integer('finished_at'),
}, (t) => [index('log_imports_survey_idx').on(t.surveyId)]);

/** One decode of a survey's samples into readings: the first on import, more on re-decode. */
export const decodes = sqliteTable('decodes', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  reason: text('reason').notNull(),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
});

/**
 * An import's accepted samples, kept for re-decoding, a batch to a row in file order (one row per
 * batch, not per sample, keeps a million-row import's writes short). `encoding` says how `data`
 * holds them: 'f64', the batch's Float64Array with `strings` its text table
 * (server/modules/imports/batch-format.ts) before readings had planes; 'f64p', the same with plane and azimuth added; 'json', a flat JSON array of the SAMPLE_SLOTS
 * values per sample (blocks migration 0003 made from the earlier one-row-per-sample table).
 */
export const sampleBlocks = sqliteTable('sample_blocks', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  importId: integer('import_id').notNull().references(() => logImports.id),
  surveyId: integer('survey_id').notNull(),
  firstLine: integer('first_line').notNull(),
  rowCount: integer('row_count').notNull(),
  encoding: text('encoding', { enum: SAMPLE_ENCODINGS }).notNull(),
  strings: text('strings'),
  data: blob('data', { mode: 'buffer' }).notNull(),
}, (t) => [index('sample_blocks_import_idx').on(t.importId)]);

export const readings = sqliteTable('readings', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull(),
  decodeId: integer('decode_id').notNull().references(() => decodes.id),
  /** The log import it came from; null for a reading recorded in the field view (field_record_id). */
  importId: integer('import_id').references(() => logImports.id),
  /** The typed field record this reading was made from (no import, no samples). */
  fieldRecordId: integer('field_record_id'),
  point: text('point').notNull(),
  xM: real('x_m'),
  yM: real('y_m'),
  /** The plan x_m, y_m refer to (from its samples); null: the reading cannot be placed. */
  planId: integer('plan_id').references((): AnySQLiteColumn => plans.id),
  role: text('role', { enum: READING_ROLES }).notNull(),
  /** Where the sensor faced: the horizontal working plane, a vertical plane (with azimuthDeg), a wall or a ceiling. */
  plane: text('plane', { enum: READING_PLANES }).notNull().default('horizontal'),
  /** Direction a vertical reading faced, degrees clockwise from the plan's +y axis. */
  azimuthDeg: real('azimuth_deg'),
  timeMs: integer('time_ms').notNull(),
  probeId: integer('probe_id').notNull().references(() => probes.id),
  lux: real('lux'),
  uLux: real('u_lux'),
  luxBound: text('lux_bound', { enum: LUX_BOUNDS }).notNull(),
  flag: text('flag', { enum: READING_FLAGS }).notNull(),
  gainCode: integer('gain_code'),
  sampleCount: integer('sample_count').notNull(),
  chosenSample: integer('chosen_sample'),
  coefficientSetId: integer('coefficient_set_id'),
  budget: text('budget', { mode: 'json' }),
  note: text('note'),
  /** Raw evidence behind the value or bound, as logged: counts (counting probes), mA or V (analog), integration time (ms), temperature (°C). */
  rawCounts: real('raw_counts'),
  rawSignal: real('raw_signal'),
  intMs: real('int_ms'),
  tempC: real('temp_c'),
  /** Why this reading is left out of its zone's statistics (a hand exclusion, reading_placements); null: included. */
  excludedReason: text('excluded_reason'),
}, (t) => [
  index('readings_decode_idx').on(t.decodeId, t.timeMs), index('readings_survey_idx').on(t.surveyId),
  // Field readings of a decode are found, counted and hashed without scanning the logged ones
  // (reading-counts.ts, verdict-aggregates.ts, field-service.ts). Partial: a logged reading has no
  // field record, so an import writes nothing to it.
  index('readings_decode_field_record_idx').on(t.decodeId, t.fieldRecordId).where(sql`${t.fieldRecordId} is not null`),
]);
