import { sqliteTable, integer, text, real, index, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { organizations, users } from './organizations';
import { logImports, surveys } from './surveys';
import { sites } from './sites';
import { plans } from './plans';
import type { EmergencyCheck, EmergencyPass } from '@shared/core/emergency';
import { EMERGENCY_TEST_KINDS, EMERGENCY_TEST_RESULTS, TEST_REMINDER_STATES } from '@shared/core/emergency-schedule';
import { EQUIPMENT_KINDS, SYSTEM_TYPES } from '@shared/schemas/emergency';
import { EMERGENCY_ELEMENT_KINDS, EMERGENCY_PASSES } from '@shared/core/emergency';

/**
 * Escape routes (centre line + width), open and high-risk task areas (outlines) and
 * safety-equipment points on a plan, in plan metres, y upwards.
 */
export const emergencyElements = sqliteTable('emergency_elements', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  planId: integer('plan_id').notNull().references(() => plans.id),
  kind: text('kind', { enum: EMERGENCY_ELEMENT_KINDS }).notNull(),
  /** Short code that starts each planned point's label (R1 -> R1-C01). Unique per plan. */
  code: text('code').notNull(),
  name: text('name').notNull(),
  geometry: text('geometry', { mode: 'json' }).$type<[number, number][]>().notNull(),
  widthM: real('width_m'),
  stair: integer('stair', { mode: 'boolean' }).notNull().default(false),
  borderM: real('border_m'),
  spacingM: real('spacing_m'),
  normalEmLux: real('normal_em_lux'),
  normalZoneId: integer('normal_zone_id'),
  equipment: text('equipment', { enum: EQUIPMENT_KINDS }),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('emergency_elements_plan_idx').on(t.planId), uniqueIndex('emergency_elements_code_idx').on(t.planId, t.code)]);

/** An emergency survey: a survey row plus the criteria set and test conditions. */
export const emergencySurveys = sqliteTable('emergency_surveys', {
  surveyId: integer('survey_id').primaryKey().references(() => surveys.id),
  criteriaSetKey: text('criteria_set_key').notNull(),
  systemType: text('system_type', { enum: SYSTEM_TYPES }).notNull(),
  ratedDurationMin: integer('rated_duration_min').notNull(),
  mainsOffAt: integer('mains_off_at').notNull(),
  normalLightingOff: integer('normal_lighting_off', { mode: 'boolean' }).notNull(),
  daylightExcluded: integer('daylight_excluded', { mode: 'boolean' }).notNull(),
  notes: text('notes'),
});

/** Response times typed per element for a survey. */
export const emergencyResponses = sqliteTable('emergency_responses', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  elementId: integer('element_id').notNull().references(() => emergencyElements.id),
  toHalfS: real('to_half_s'),
  toFullS: real('to_full_s'),
}, (t) => [uniqueIndex('emergency_responses_idx').on(t.surveyId, t.elementId)]);

/** An organisation's own criteria sets, kept as data (checks in the core's shape). */
export const emergencyCriteriaSets = sqliteTable('emergency_criteria_sets', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  name: text('name').notNull(),
  source: text('source').notNull(),
  requiredPasses: text('required_passes', { mode: 'json' }).$type<EmergencyPass[]>().notNull(),
  checks: text('checks', { mode: 'json' }).$type<EmergencyCheck[]>().notNull(),
  notes: text('notes', { mode: 'json' }).$type<string[]>().notNull(),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('emergency_criteria_sets_org_idx').on(t.organizationId)]);

/** Functional and full-duration tests of a site's emergency lighting. Append-only. */
export const emergencyTests = sqliteTable('emergency_tests', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  siteId: integer('site_id').notNull().references(() => sites.id),
  kind: text('kind', { enum: EMERGENCY_TEST_KINDS }).notNull(),
  /** Calendar date in the site's time zone. */
  testedOn: text('tested_on').notNull(),
  testedBy: text('tested_by').notNull(),
  result: text('result', { enum: EMERGENCY_TEST_RESULTS }).notNull(),
  failedFittings: text('failed_fittings', { mode: 'json' }).$type<string[]>().notNull(),
  remarks: text('remarks').notNull(),
  recordedBy: integer('recorded_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('emergency_tests_site_idx').on(t.siteId, t.testedOn)]);

/** An organisation's own test intervals; absent: the defaults (30 days, 12 months). */
export const emergencyTestSchedules = sqliteTable('emergency_test_schedules', {
  organizationId: integer('organization_id').primaryKey().references(() => organizations.id),
  functionalEveryDays: integer('functional_every_days').notNull(),
  fullDurationEveryMonths: integer('full_duration_every_months').notNull(),
});

/** Reminders sent for a site's due or overdue test (at most one per site and kind a week). */
export const emergencyTestReminders = sqliteTable('emergency_test_reminders', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  siteId: integer('site_id').notNull().references(() => sites.id),
  kind: text('kind', { enum: EMERGENCY_TEST_KINDS }).notNull(),
  state: text('state', { enum: TEST_REMINDER_STATES }).notNull(),
  sentAt: integer('sent_at').notNull(),
}, (t) => [index('emergency_test_reminders_site_idx').on(t.siteId, t.sentAt)]);

/**
 * The pass a survey's log belongs to, as the surveyor says (one log taken right after the mains
 * failed, another at the end of the rated duration). A log with no row here is split by time.
 */
export const emergencyLogPasses = sqliteTable('emergency_log_passes', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  surveyId: integer('survey_id').notNull().references(() => surveys.id),
  importId: integer('import_id').notNull().references(() => logImports.id),
  pass: text('pass', { enum: EMERGENCY_PASSES }).notNull(),
}, (t) => [uniqueIndex('emergency_log_passes_idx').on(t.surveyId, t.importId)]);
