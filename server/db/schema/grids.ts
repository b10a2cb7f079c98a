import { sqliteTable, integer, text, real, index, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { users } from './organizations';
import { surveys } from './surveys';
import { plans, zones } from './plans';
import { probes } from './calibration';
import { GRID_LAYOUTS, GRID_ROUNDINGS, GRID_SURFACES, PLANNED_PLANES } from '@shared/spatial/measurement-grid';
import { PLACEMENT_STATES, POINT_ORIGINS } from '@shared/schemas/planned-points';

export type GeneratedPoint = { label: string; xM: number; yM: number };

/**
 * The measurement grid planned for one zone in one survey: the rule it was generated with, the
 * generated points (to tell a changed grid from the generated one) and the written reason for a change.
 */
export const surveyGrids = sqliteTable('survey_grids', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  zoneId: integer('zone_id').notNull().references(() => zones.id, { onDelete: 'cascade' }),
  planId: integer('plan_id').notNull().references(() => plans.id),
  /** Short zone code, the first part of every label of this grid (e.g. OF1). */
  code: text('code').notNull(),
  /** The surface gridded: the working plane, the room's walls or its ceiling (GRID_SURFACES). */
  surface: text('surface', { enum: GRID_SURFACES }).notNull().default('working_plane'),
  rounding: text('rounding', { enum: GRID_ROUNDINGS }).notNull(),
  layout: text('layout', { enum: GRID_LAYOUTS }).notNull(),
  /** The room height a wall grid was planned for, metres (walls only). */
  wallHeightM: real('wall_height_m'),
  spacingM: real('spacing_m').notNull(),
  dM: real('d_m').notNull(),
  generated: text('generated', { mode: 'json' }).$type<GeneratedPoint[]>().notNull(),
  /** Why the grid differs from the generated one; required while it does. */
  reason: text('reason'),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
  updatedAt: integer('updated_at').notNull(),
}, (t) => [uniqueIndex('survey_grids_zone_surface_uq').on(t.surveyId, t.zoneId, t.surface), uniqueIndex('survey_grids_code_surface_uq').on(t.surveyId, t.code, t.surface)]);

/** A point the surveyor plans to measure; its label is unique within the survey (compared trimmed and case-insensitively). */
export const plannedPoints = sqliteTable('planned_points', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  gridId: integer('grid_id').notNull().references(() => surveyGrids.id, { onDelete: 'cascade' }),
  planId: integer('plan_id').notNull().references(() => plans.id),
  zoneId: integer('zone_id').notNull().references(() => zones.id, { onDelete: 'cascade' }),
  label: text('label').notNull(),
  labelKey: text('label_key').notNull(),
  xM: real('x_m').notNull(),
  yM: real('y_m').notNull(),
  /** The plane a reading here is taken on: horizontal (working plane), wall or ceiling. */
  plane: text('plane', { enum: PLANNED_PLANES }).notNull().default('horizontal'),
  /** Height above the floor of a wall point, metres; null elsewhere. */
  heightM: real('height_m'),
  /** Direction a wall point's sensor faces, degrees clockwise from the plan's up; null elsewhere. */
  azimuthDeg: real('azimuth_deg'),
  origin: text('origin', { enum: POINT_ORIGINS }).notNull(),
  createdAt: integer('created_at').notNull(),
}, (t) => [uniqueIndex('planned_points_label_uq').on(t.surveyId, t.labelKey), index('planned_points_plan_idx').on(t.surveyId, t.planId)]);

/**
 * A hand placement or exclusion of one reading, keyed by the log's point label, probe and time
 * (not by reading id), so it is applied again to the readings of every later decode.
 * state 'placed': plan and position set (optionally a planned point); 'unplaced': no position;
 * 'as_logged': the position the log gave (only an exclusion recorded).
 */
export const readingPlacements = sqliteTable('reading_placements', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  point: text('point').notNull(),
  probeId: integer('probe_id').notNull().references(() => probes.id),
  timeMs: integer('time_ms').notNull(),
  state: text('state', { enum: PLACEMENT_STATES }).notNull(),
  planId: integer('plan_id').references(() => plans.id),
  xM: real('x_m'),
  yM: real('y_m'),
  plannedPointId: integer('planned_point_id').references(() => plannedPoints.id, { onDelete: 'set null' }),
  placeReason: text('place_reason'),
  excludedReason: text('excluded_reason'),
  updatedBy: integer('updated_by').references(() => users.id),
  updatedAt: integer('updated_at').notNull(),
}, (t) => [uniqueIndex('reading_placements_key_uq').on(t.surveyId, t.point, t.probeId, t.timeMs)]);
