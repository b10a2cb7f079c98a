import { METER_CLASSES } from '@shared/core/typed-readings';
import { sqliteTable, integer, text, real, uniqueIndex, index } from 'drizzle-orm/sqlite-core';
import { organizations, users, storedFiles } from './organizations';
import { ANALOG_SCALES, PROBE_KINDS, PROBE_STATUSES } from '@shared/schemas/probes';
import { CALIBRATION_REMINDER_KINDS, COEFFICIENT_SET_STATUSES } from '@shared/schemas/coefficient-sets';

export type GainStepRow = { code: number; nominalGain: number };
/** uDarkCounts: standard uncertainty of the dark offset, counts (from a bench fit); absent: the core's default. */
export type GainCoefficientsRow = { code: number; darkCounts: number; luxPerCount: number; uRel: number; uDarkCounts?: number };

export const probes = sqliteTable('probes', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  serial: text('serial').notNull(),
  kind: text('kind', { enum: PROBE_KINDS }).notNull(),
  description: text('description').notNull().default(''),
  status: text('status', { enum: PROBE_STATUSES }).notNull().default('in_service'),
  fullScaleCounts: integer('full_scale_counts'),
  saturationCounts: integer('saturation_counts'),
  floorCounts: integer('floor_counts'),
  gains: text('gains', { mode: 'json' }).$type<GainStepRow[]>(),
  rangeLowLux: real('range_low_lux'),
  rangeHighLux: real('range_high_lux'),
  scale: text('scale', { enum: ANALOG_SCALES }),
  accuracyPercent: real('accuracy_percent'),
  /** A hand-held meter without logging: its DIN 5032-7 class, or null to use its certificate's uncertainty. */
  meterClass: text('meter_class', { enum: METER_CLASSES }),
  createdAt: integer('created_at').notNull(),
  updatedAt: integer('updated_at').notNull(),
}, (t) => [uniqueIndex('probes_org_serial_idx').on(t.organizationId, t.serial)]);

export const benchRuns = sqliteTable('bench_runs', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  probeId: integer('probe_id').notNull().references(() => probes.id),
  fileId: integer('file_id').notNull().references(() => storedFiles.id),
  rowCount: integer('row_count').notNull(),
  /** The parsed rows and the core's fit, kept so the screen and a later draft agree. */
  rows: text('rows', { mode: 'json' }).notNull(),
  fit: text('fit', { mode: 'json' }).notNull(),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: integer('created_at').notNull(),
});

/** A versioned coefficient set: drafted, then approved by a second person; approved sets never change. */
export const coefficientSets = sqliteTable('coefficient_sets', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  probeId: integer('probe_id').notNull().references(() => probes.id),
  version: integer('version').notNull(),
  status: text('status', { enum: COEFFICIENT_SET_STATUSES }).notNull().default('draft'),
  effectiveFrom: integer('effective_from').notNull(),
  dueDate: integer('due_date').notNull(),
  tRefMs: real('t_ref_ms').notNull(),
  alphaPerK: real('alpha_per_k').notNull(),
  tCalC: real('t_cal_c').notNull(),
  gains: text('gains', { mode: 'json' }).$type<GainCoefficientsRow[]>().notNull(),
  certificateNumber: text('certificate_number').notNull(),
  certificateFileId: integer('certificate_file_id').references(() => storedFiles.id),
  benchRunId: integer('bench_run_id').references(() => benchRuns.id),
  note: text('note').notNull().default(''),
  draftedBy: integer('drafted_by').references(() => users.id),
  approvedBy: integer('approved_by').references(() => users.id),
  approvedAt: integer('approved_at'),
  createdAt: integer('created_at').notNull(),
}, (t) => [uniqueIndex('coefficient_sets_probe_version_idx').on(t.probeId, t.version), index('coefficient_sets_effective_idx').on(t.probeId, t.effectiveFrom)]);

/** One row per reminder sent, so a probe is reminded at most once a week. */
export const calibrationReminders = sqliteTable('calibration_reminders', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  probeId: integer('probe_id').notNull().references(() => probes.id),
  kind: text('kind', { enum: CALIBRATION_REMINDER_KINDS }).notNull(),
  sentAt: integer('sent_at').notNull(),
}, (t) => [index('reminders_probe_idx').on(t.probeId, t.sentAt)]);
