import { sqliteTable, integer, text, real, index } from 'drizzle-orm/sqlite-core';
import { sites } from './sites';
import { storedFiles } from './organizations';
import { ZONE_KINDS } from '@shared/schemas/zones';

export const plans = sqliteTable('plans', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  siteId: integer('site_id').notNull().references(() => sites.id),
  name: text('name').notNull(),
  fileId: integer('file_id').notNull().references(() => storedFiles.id),
  widthPx: integer('width_px').notNull(),
  heightPx: integer('height_px').notNull(),
  /** Metres per image pixel; null until the scale is set. */
  metresPerPixel: real('metres_per_pixel'),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('plans_site_idx').on(t.siteId)]);

export const zones = sqliteTable('zones', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  planId: integer('plan_id').notNull().references(() => plans.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  kind: text('kind', { enum: ZONE_KINDS }).notNull(),
  useType: text('use_type').notNull(),
  targetId: integer('target_id'),
  planeHeightM: real('plane_height_m').notNull().default(0.75),
  wallBandM: real('wall_band_m').notNull().default(0.5),
  /** The maintained value the design chose between the entry's required and modified ones; null: the required. */
  chosenEmLux: real('chosen_em_lux'),
  /** Context modifiers (shared/core/illuminance-scale CONTEXT_MODIFIERS ids) that led to the chosen value. */
  contextModifiers: text('context_modifiers', { mode: 'json' }).$type<string[]>().notNull().default([]),
  contextNote: text('context_note'),
  /** Corners in plan metres from the lower-left corner, y upwards. */
  polygon: text('polygon', { mode: 'json' }).$type<[number, number][]>().notNull(),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('zones_plan_idx').on(t.planId)]);
