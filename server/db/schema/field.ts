import { sqliteTable, integer, text, real, index, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { organizations, users, storedFiles } from './organizations';
import { surveys, logImports } from './surveys';
import { probes } from './calibration';
import { plans, zones } from './plans';
import { SKY_STATES } from '@shared/core/field-conditions';
import { BLINDS_STATES, FIELD_RECORD_KINDS, FIELD_UNITS, LIGHTS_STATES } from '@shared/schemas/field';

/**
 * Measurement conditions of one visit to a survey's site (a survey may take several). Written from
 * the phone, so keyed by the client's idempotency key: a repeated sync finds the same row.
 */
export const fieldSessions = sqliteTable('field_sessions', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  idempotencyKey: text('idempotency_key').notNull(),
  measuredBy: text('measured_by').notNull(),
  startedAt: integer('started_at').notNull(),
  lightsOnAt: integer('lights_on_at'),
  supplyVoltageV: real('supply_voltage_v'),
  ambientTempC: real('ambient_temp_c'),
  sky: text('sky', { enum: SKY_STATES }),
  blinds: text('blinds', { enum: BLINDS_STATES }),
  lampBurnInHours: real('lamp_burn_in_hours'),
  daylightExcluded: integer('daylight_excluded', { mode: 'boolean' }).notNull(),
  note: text('note'),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
}, (t) => [uniqueIndex('field_sessions_key_uq').on(t.surveyId, t.idempotencyKey)]);

/**
 * What the surveyor recorded at a point on site: values typed from a meter that does not log
 * ('typed', kept as typed with their unit; the reading they make lives in `readings` with
 * field_record_id), a "measured here now" mark for a logging meter ('mark'), a point skipped
 * with a reason ('skip'), or a written note on a whole zone ('zone_note': zone_id set, `point`
 * holds the zone's name as it was then). `lights` marks half of a lights-on/off pair.
 */
export const fieldRecords = sqliteTable('field_records', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  idempotencyKey: text('idempotency_key').notNull(),
  kind: text('kind', { enum: FIELD_RECORD_KINDS }).notNull(),
  sessionId: integer('session_id').references(() => fieldSessions.id),
  point: text('point').notNull(),
  plannedPointId: integer('planned_point_id'),
  /** The zone a zone note is about (null for point records). */
  zoneId: integer('zone_id').references(() => zones.id, { onDelete: 'set null' }),
  planId: integer('plan_id').references(() => plans.id),
  xM: real('x_m'),
  yM: real('y_m'),
  probeId: integer('probe_id').references(() => probes.id),
  /** Typed values in the unit the surveyor typed them. */
  values: text('values', { mode: 'json' }).$type<number[]>(),
  unit: text('unit', { enum: FIELD_UNITS }),
  lights: text('lights', { enum: LIGHTS_STATES }),
  reason: text('reason'),
  note: text('note'),
  /** The instant on the phone's clock. */
  timeMs: integer('time_ms').notNull(),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
}, (t) => [uniqueIndex('field_records_key_uq').on(t.surveyId, t.idempotencyKey), index('field_records_survey_idx').on(t.surveyId, t.timeMs)]);

/** A photo of a point or a zone, kept by content hash (shrunk, location removed unless kept). */
export const fieldPhotos = sqliteTable('field_photos', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  idempotencyKey: text('idempotency_key').notNull(),
  fileId: integer('file_id').notNull().references(() => storedFiles.id),
  point: text('point'),
  plannedPointId: integer('planned_point_id'),
  zoneId: integer('zone_id').references(() => zones.id, { onDelete: 'set null' }),
  note: text('note'),
  widthPx: integer('width_px').notNull(),
  heightPx: integer('height_px').notNull(),
  locationKept: integer('location_kept', { mode: 'boolean' }).notNull(),
  takenAt: integer('taken_at').notNull(),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
}, (t) => [uniqueIndex('field_photos_key_uq').on(t.surveyId, t.idempotencyKey)]);

/** How a label-free log was placed by time: its options and the bursts and marks left over. */
export const markMatchings = sqliteTable('mark_matchings', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  importId: integer('import_id').notNull().references(() => logImports.id),
  windowMs: integer('window_ms').notNull(),
  clockOffsetMs: integer('clock_offset_ms').notNull(),
  /** {matched, unplaced, marksWithoutBurst} as shared/core matchBurstsToMarks gave them, with labels. */
  result: text('result', { mode: 'json' }).notNull(),
  createdAt: integer('created_at').notNull(),
}, (t) => [uniqueIndex('mark_matchings_import_uq').on(t.importId)]);
